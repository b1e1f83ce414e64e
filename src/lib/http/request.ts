import type { z, ZodTypeAny } from 'zod';
import { config } from '../config';
import { HttpError, badRequest } from './errors';

const MAX_JSON_BYTES = 256 * 1024;
const MAX_FORM_BYTES = 16 * 1024;

const tooLarge = (limit: number) => new HttpError(413, 'too_large', `The request body is larger than the ${limit / 1024} KB this request accepts. Nothing was changed.`);

/** What is read and dropped after an early answer, at most: */
const DISCARD_BYTES = 32 * 1024 * 1024;
const DISCARD_MS = 10_000;

/**
 * After answering a request before its whole body arrived: reads and drops
 * the rest for a little while, then closes the connection. Closing at once
 * with unread data would reset the connection, and the client could lose the
 * answer it was sent; reading on costs no memory, and the bound keeps an
 * endless body from costing more than that.
 */
export function discardRest(reader: ReadableStreamDefaultReader<Uint8Array>): void {
  const deadline = Date.now() + DISCARD_MS;
  void (async () => {
    let bytes = 0;
    try {
      while (bytes <= DISCARD_BYTES) {
        const left = deadline - Date.now();
        if (left <= 0) break;
        let timer: NodeJS.Timeout | undefined;
        const next = await Promise.race([reader.read(), new Promise<null>((r) => (timer = setTimeout(() => r(null), left)))]);
        clearTimeout(timer);
        if (next === null) break;
        if (next.done) return;
        bytes += next.value.byteLength;
      }
      await reader.cancel();
    } catch {
      // The client went away: nothing left to read.
    }
  })();
}

/**
 * The request body, read up to `limit` bytes: a longer body is refused with
 * 413 as soon as its first byte over the limit arrives (or at once when its
 * declared length says so), whatever the transfer encoding; nothing over the
 * limit is kept.
 */
export async function readBody(request: Request, limit: number): Promise<Uint8Array> {
  const length = Number(request.headers.get('content-length') ?? 0);
  if (!request.body) return new Uint8Array(0);
  const reader = request.body.getReader();
  if (length > limit) {
    discardRest(reader);
    throw tooLarge(limit);
  }
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    let next: ReadableStreamReadResult<Uint8Array>;
    try {
      next = await reader.read();
    } catch {
      throw badRequest('The request body stopped before it was complete.');
    }
    if (next.done) break;
    size += next.value.byteLength;
    if (size > limit) {
      discardRest(reader);
      throw tooLarge(limit);
    }
    chunks.push(next.value);
  }
  const body = new Uint8Array(size);
  let at = 0;
  for (const c of chunks) {
    body.set(c, at);
    at += c.byteLength;
  }
  return body;
}

/** Reads a JSON body and validates it with `schema`; a bad body is a 400 that says what is wrong. */
export async function readJson<S extends ZodTypeAny>(request: Request, schema: S): Promise<z.output<S>> {
  const type = request.headers.get('content-type') ?? '';
  if (!type.toLowerCase().includes('application/json')) {
    throw new HttpError(415, 'unsupported_media_type', 'Send the request body as JSON (Content-Type: application/json).');
  }
  const text = new TextDecoder().decode(await readBody(request, MAX_JSON_BYTES));
  let data: unknown;
  try {
    data = text ? JSON.parse(text) : {};
  } catch {
    throw badRequest('The request body is not valid JSON.');
  }
  return schema.parse(data);
}

/** Reads a URL-encoded form post (a page's form without JavaScript), up to 16 KB. */
export async function readForm(request: Request): Promise<URLSearchParams> {
  const type = request.headers.get('content-type') ?? '';
  if (!type.toLowerCase().startsWith('application/x-www-form-urlencoded')) {
    throw new HttpError(415, 'unsupported_media_type', 'Send the form as application/x-www-form-urlencoded.');
  }
  return new URLSearchParams(new TextDecoder().decode(await readBody(request, MAX_FORM_BYTES)));
}

/**
 * The caller's address. Behind a reverse proxy (KINLOOP_TRUST_PROXY=1) it is the
 * last X-Forwarded-For entry, the one the trusted proxy appended itself.
 */
export function clientIp(request: Request, socketAddress: string | undefined): string {
  if (config().trustProxy) {
    const forwarded = request.headers.get('x-forwarded-for');
    if (forwarded) {
      const parts = forwarded.split(',').map((p) => p.trim()).filter(Boolean);
      if (parts.length) return parts[parts.length - 1];
    }
  }
  return socketAddress ?? 'unknown';
}
