import type { z, ZodTypeAny } from 'zod';
import { config } from '../config';
import { HttpError, badRequest } from './errors';

const MAX_JSON_BYTES = 256 * 1024;

/** Reads a JSON body and validates it with `schema`; a bad body is a 400 that says what is wrong. */
export async function readJson<S extends ZodTypeAny>(request: Request, schema: S): Promise<z.output<S>> {
  const type = request.headers.get('content-type') ?? '';
  if (!type.toLowerCase().includes('application/json')) {
    throw new HttpError(415, 'unsupported_media_type', 'Send the request body as JSON (Content-Type: application/json).');
  }
  const length = Number(request.headers.get('content-length') ?? 0);
  if (length > MAX_JSON_BYTES) throw new HttpError(413, 'too_large', 'The request body is too large.');
  const text = await request.text();
  if (text.length > MAX_JSON_BYTES) throw new HttpError(413, 'too_large', 'The request body is too large.');
  let data: unknown;
  try {
    data = text ? JSON.parse(text) : {};
  } catch {
    throw badRequest('The request body is not valid JSON.');
  }
  return schema.parse(data);
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
