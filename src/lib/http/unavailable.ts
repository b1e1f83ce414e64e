// Errors that mean a service Kinloop depends on is away (a restart, a network
// cut), not that the request was wrong: they answer 503 with what to do, and
// the next request after the service is back succeeds without a restart.

// Node's socket errors and PostgreSQL's "connection exception" (08…) and
// "operator intervention" (57P…) classes.
const SOCKET_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENOTFOUND', 'EAI_AGAIN']);
const CONNECTION_MESSAGES = /Connection terminated|connection error|Timeout acquiring a connection|server closed the connection|terminating connection/i;

export function isDatabaseUnavailable(err: unknown): boolean {
  const e = err as { code?: unknown; message?: unknown; name?: unknown; $metadata?: unknown } | null;
  if (!e || typeof e !== 'object' || e.$metadata !== undefined) return false;
  if (e.name === 'KnexTimeoutError') return true;
  if (typeof e.code === 'string' && (SOCKET_CODES.has(e.code) || /^(08|57P)/.test(e.code))) return true;
  return typeof e.message === 'string' && CONNECTION_MESSAGES.test(e.message);
}

/** An error of the S3 client that says the store could not be reached (not that an object is missing). */
export function isStorageUnavailable(err: unknown): boolean {
  const e = err as { code?: unknown; name?: unknown; $metadata?: { httpStatusCode?: number } } | null;
  if (!e || typeof e !== 'object') return false;
  if (e.$metadata === undefined) return false;
  return e.$metadata.httpStatusCode === undefined || e.$metadata.httpStatusCode >= 500;
}

export const DATABASE_UNAVAILABLE = 'Kinloop cannot reach its database right now, so nothing was read or changed. Try again in a minute; if it lasts, tell whoever runs Kinloop for the clinic.';
export const STORAGE_UNAVAILABLE = 'Kinloop cannot reach its file store right now, so the file cannot be read. Try again in a few minutes.';
