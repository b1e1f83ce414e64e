import { auditListed, type RequestContext } from '../auth/context';
import type { ClientRow, FlagRow } from '../db/tables';
import { forbidden } from '../http/errors';
import { FLAG_SEVERITIES } from '../flags';
import { flagView } from './flags';
import { overviews } from './overview';
import { careStatuses } from '../care/care-status';

const severityRank = (s: FlagRow['severity']) => FLAG_SEVERITIES.indexOf(s);

/**
 * The staff caseload: every client of the caller's clinics with their open
 * flags (open, not snoozed), last session, 4-week adherence, streak and power
 * trend. Triage is the same rows limited to clients with open flags, most
 * severe and oldest first.
 */
export async function caseload(ctx: RequestContext, { onlyFlagged }: { onlyFlagged: boolean }) {
  const clinics = ctx.viewer.memberships.map((m) => m.clinicId);
  if (!clinics.length) throw forbidden('Triage and the caseload are for clinic staff.');
  const now = new Date();
  const flags = await ctx.knex<FlagRow>('flags')
    .whereIn('clinic_id', clinics)
    .where({ state: 'open' })
    .where((q) => q.whereNull('snoozed_until').orWhere('snoozed_until', '<', ctx.knex.raw('current_date')));
  const flagged = new Set(flags.map((f) => f.client_id));
  const clients: ClientRow[] = await ctx.knex<ClientRow>('clients')
    .whereIn('clinic_id', clinics)
    .whereNull('archived_at')
    .modify((q) => {
      if (onlyFlagged) q.whereIn('id', [...flagged]);
    })
    .orderBy('display_name');
  const figures = await overviews(ctx.knex, clients, now);
  // Readiness, "no plan on file" and a missing baseline (issue 12): one small read per table.
  const care = await careStatuses(ctx.knex, clients, now);
  await auditListed(ctx, onlyFlagged ? 'triage.view' : 'caseload.view', clients);
  const rows = clients.map((c) => {
    const own = flags
      .filter((f) => f.client_id === c.id)
      .sort((a, b) => severityRank(a.severity) - severityRank(b.severity) || a.raised_at.getTime() - b.raised_at.getTime())
      .map(flagView);
    return { clientId: c.id, clientName: c.display_name, flags: own, ...figures.get(c.id)!, care: care.get(c.id)! };
  });
  if (!onlyFlagged) return rows;
  // Most severe first, then the longest waiting.
  return rows.sort((a, b) => severityRank(a.flags[0].severity) - severityRank(b.flags[0].severity) || a.flags[0].raisedAt.localeCompare(b.flags[0].raisedAt));
}
