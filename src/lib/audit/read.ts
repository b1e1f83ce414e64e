import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import { line, rowId } from '../validation/fields';

export const auditQuerySchema = z.object({
  clinicId: z.string().uuid().optional(),
  clientId: z.string().uuid().optional(),
  action: line(z.string().max(80), 'Action').optional(),
  before: rowId('Before').optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});

/**
 * The clinic's audit log, newest first, for its admins. Entries without a
 * clinic (sign-ins, refused requests) are included when their actor belongs
 * to the clinic, but never name another clinic's client or record. Filtering
 * by a client also finds the lists that showed them.
 */
export async function readAuditLog(ctx: RequestContext, query: z.infer<typeof auditQuerySchema>) {
  const { clinicId, query: log } = scope(ctx).auditLog(query.clinicId, 'a');
  const q = log
    .leftJoin('users as u', 'u.id', 'a.actor_user_id')
    .leftJoin('clients as c', (j) => j.on('c.id', 'a.client_id').andOnVal('c.clinic_id', '=', clinicId))
    .orderBy('a.id', 'desc')
    .limit(query.limit)
    .select('a.*', 'u.name as actor_name', 'u.email as actor_email', 'c.display_name as client_name');
  if (query.clientId) {
    const clientId = query.clientId;
    q.where((w) => w.where('a.client_id', clientId).orWhereRaw("a.detail -> 'clientIds' @> ?::jsonb", [JSON.stringify([clientId])]));
  }
  if (query.action) q.where('a.action', 'like', `${query.action.replace(/[%_\\]/g, '\\$&')}%`);
  if (query.before) q.where('a.id', '<', query.before);
  const rows = await q;
  return rows.map((r) => ({
    id: Number(r.id),
    at: r.at.toISOString(),
    action: r.action,
    actor: r.actor_user_id ? { userId: r.actor_user_id, name: r.actor_name, email: r.actor_email } : null,
    clientId: r.client_name === null ? null : r.client_id,
    clientName: r.client_name,
    recordType: r.record_type,
    // A record outside this clinic (a refused request of one of its staff) is not named.
    recordId: r.clinic_id === clinicId || r.record_type === 'auth_session' ? r.record_id : null,
    ip: r.ip,
    detail: r.detail,
  }));
}
