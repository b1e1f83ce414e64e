import type { ApiError } from '../api';

/**
 * The sentence above a form after a refused save: a pointer to the fields when
 * every message the server gave sits by a field of the form, else the server's
 * own message (which then names what is wrong).
 */
export function formErrorText(error: ApiError, fieldPaths: (path: string) => boolean): string {
  const fields = error.body.fields ?? [];
  if (fields.length && fields.every((f) => fieldPaths(f.path))) {
    return fields.length === 1 ? 'One value needs a change: see the message by the field.' : 'Some values need a change: see the messages by the fields.';
  }
  return error.message;
}
