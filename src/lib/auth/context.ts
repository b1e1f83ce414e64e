import type { Knex } from 'knex';
import { audit, type AuditEntry } from '../audit/audit';
import { db } from '../db/knex';
import { unauthenticated } from '../http/errors';
import type { Viewer } from './viewer';

/** What a request's service calls need: the database, the caller, and where they call from (for the audit log). */
export interface RequestContext {
  knex: Knex;
  viewer: Viewer;
  ip: string;
  userAgent: string | null;
}

export interface RequestLocals {
  viewer: Viewer | null;
  ip: string;
  userAgent: string | null;
}

/** The signed-in caller's context; a request without a valid session is a 401. */
export function signedIn(locals: RequestLocals): RequestContext {
  if (!locals.viewer) throw unauthenticated();
  return { knex: db(), viewer: locals.viewer, ip: locals.ip, userAgent: locals.userAgent };
}

export function auditAs(ctx: RequestContext, entry: Omit<AuditEntry, 'actorUserId' | 'ip' | 'userAgent'>, knex: Knex | Knex.Transaction = ctx.knex) {
  return audit(knex, { ...entry, actorUserId: ctx.viewer.userId, ip: ctx.ip, userAgent: ctx.userAgent });
}
