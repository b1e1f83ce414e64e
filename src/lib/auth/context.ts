import { unauthenticated } from '../http/errors';
import type { Viewer } from './viewer';

/** Who calls, and from where (for the audit log). `scope(ctx)` (src/lib/data) gives what they may see. */
export interface RequestContext {
  viewer: Viewer;
  ip: string;
  userAgent: string | null;
}

export interface RequestLocals {
  viewer: Viewer | null;
  ip: string;
  userAgent: string | null;
}

const contexts = new WeakMap<RequestLocals, RequestContext>();

/**
 * The signed-in caller's context, the same object for every call in one
 * request (so its scope, and what it has audited, is shared); a request
 * without a valid session is a 401.
 */
export function signedIn(locals: RequestLocals): RequestContext {
  if (!locals.viewer) throw unauthenticated();
  let ctx = contexts.get(locals);
  if (!ctx || ctx.viewer !== locals.viewer) contexts.set(locals, (ctx = { viewer: locals.viewer, ip: locals.ip, userAgent: locals.userAgent }));
  return ctx;
}
