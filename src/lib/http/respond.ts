import { ZodError } from 'zod';
import { HttpError } from './errors';
import { DATABASE_UNAVAILABLE, isDatabaseUnavailable, isStorageUnavailable, STORAGE_UNAVAILABLE } from './unavailable';

const NO_STORE = { 'cache-control': 'no-store' };

export function json(body: unknown, status = 200, headers: Record<string, string> = {}): Response {
  const text = JSON.stringify(body);
  // The length lets the server's compression leave small answers as they are (scripts/serve.mjs).
  return new Response(text, {
    status,
    headers: { 'content-type': 'application/json; charset=utf-8', 'content-length': String(Buffer.byteLength(text)), ...NO_STORE, ...headers },
  });
}

export function errorResponse(err: unknown): Response {
  if (err instanceof HttpError) {
    return json({ error: { code: err.code, message: err.message, ...err.extra } }, err.status, err.headers);
  }
  if (err instanceof ZodError) {
    const fields = err.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
    const first = fields[0];
    const message = first
      ? `${first.path ? `${first.path}: ` : ''}${first.message}`
      : 'The request was not valid.';
    return json({ error: { code: 'invalid_input', message, fields } }, 400);
  }
  if (isDatabaseUnavailable(err)) {
    console.error('database unavailable:', (err as Error).message);
    return json({ error: { code: 'database_unavailable', message: DATABASE_UNAVAILABLE } }, 503, { 'retry-after': '30' });
  }
  if (isStorageUnavailable(err)) {
    console.error('file store unavailable:', (err as Error).message);
    return json({ error: { code: 'storage_unavailable', message: STORAGE_UNAVAILABLE } }, 503, { 'retry-after': '30' });
  }
  console.error(err);
  return json(
    { error: { code: 'server_error', message: 'Something went wrong on our side. Nothing was changed; please try again in a moment.' } },
    500,
  );
}

/** Runs an endpoint body and maps thrown errors to their JSON answer. */
export async function handle(fn: () => Promise<Response>): Promise<Response> {
  try {
    return await fn();
  } catch (err) {
    return errorResponse(err);
  }
}
