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

const contexts = new WeakMap<RequestLocals, RequestContext>();

/**
 * The signed-in caller's context, the same object for every call in one
 * request (so its scope, and what it has audited, is shared); a request
 * without a valid session is a 401.
 */
export function signedIn(locals: RequestLocals): RequestContext {
  if (!locals.viewer) throw unauthenticated();
  let ctx = contexts.get(locals);
  if (!ctx || ctx.viewer !== locals.viewer) contexts.set(locals, (ctx = { knex: db(), viewer: locals.viewer, ip: locals.ip, userAgent: locals.userAgent }));
  return ctx;
}

export function auditAs(ctx: RequestContext, entry: Omit<AuditEntry, 'actorUserId' | 'ip' | 'userAgent'>, knex: Knex | Knex.Transaction = ctx.knex) {
  return audit(knex, { ...entry, actorUserId: ctx.viewer.userId, ip: ctx.ip, userAgent: ctx.userAgent });
}

/**
 * Records which clients a list (triage, caseload, client list) showed: one
 * entry per clinic, so each clinic's admins see what was shown of their own
 * clinic and nothing of another's. Filtering the log by a client finds them.
 */
export async function auditListed(ctx: RequestContext, action: string, shown: { id: string; clinic_id: string }[]) {
  const byClinic = new Map<string, string[]>();
  for (const c of shown) byClinic.set(c.clinic_id, [...(byClinic.get(c.clinic_id) ?? []), c.id]);
  if (!byClinic.size) return auditAs(ctx, { action, detail: { count: 0, clientIds: [] } });
  for (const [clinicId, clientIds] of byClinic) await auditAs(ctx, { action, clinicId, detail: { count: clientIds.length, clientIds } });
}
