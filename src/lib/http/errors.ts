// Errors that endpoints throw and `handle` turns into JSON answers of the form
// { "error": { "code", "message", ... } }.

export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly extra: Record<string, unknown> = {},
    readonly headers: Record<string, string> = {},
  ) {
    super(message);
  }
}

export const unauthenticated = () =>
  new HttpError(401, 'unauthenticated', 'You are not signed in, or your session has ended. Sign in and try again.');

/** For records the caller may not see: never reveal that they exist. */
export const notFound = (what = 'That record') =>
  new HttpError(404, 'not_found', `${what} was not found, or you do not have access to it.`);

export const forbidden = (message = 'Your role does not allow this action. Ask your clinic administrator if you need it.') =>
  new HttpError(403, 'forbidden', message);

export const badRequest = (message: string, extra: Record<string, unknown> = {}) =>
  new HttpError(400, 'invalid_input', message, extra);

export const conflict = (code: string, message: string) => new HttpError(409, code, message);
