import type { Db } from '../data/db';

export interface AuditEntry {
  actorUserId: string | null;
  action: string;
  clinicId?: string | null;
  clientId?: string | null;
  recordType?: string | null;
  recordId?: string | null;
  ip?: string | null;
  userAgent?: string | null;
  detail?: Record<string, unknown>;
}

/**
 * A value as the log can hold it: PostgreSQL text and JSONB refuse NUL and
 * broken UTF-16, and a refused write must never turn a request into a 500.
 */
function storable(value: string): string {
  return value.replace(/\u0000/g, '\ufffd').toWellFormed();
}

/** Appends to the audit log. Pass the transaction when the change it records has one, so both land or neither. */
export async function audit(db: Db, entry: AuditEntry): Promise<void> {
  await db('audit_log').insert({
    actor_user_id: entry.actorUserId,
    action: entry.action,
    clinic_id: entry.clinicId ?? null,
    client_id: entry.clientId ?? null,
    record_type: entry.recordType ?? null,
    record_id: entry.recordId === null || entry.recordId === undefined ? null : storable(entry.recordId).slice(0, 200),
    ip: entry.ip ?? null,
    user_agent: entry.userAgent ? storable(entry.userAgent).slice(0, 400) : null,
    detail: JSON.stringify(entry.detail ?? {}, (_key, v) => (typeof v === 'string' ? storable(v) : v)),
  });
}
