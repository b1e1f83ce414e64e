import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import type { ClientRow, FlagRow } from '../db/tables';
import { forbidden } from '../http/errors';
import { compareClientsByUrgency, compareUrgency } from '../flags/urgency';
import { flagView } from './flags';
import { overviews } from './overview';
import { careStatuses } from '../care/care-status';

/**
 * The staff caseload: every client of the caller's clinics with their open
 * flags (open, not snoozed), last session, 4-week adherence, streak and power
 * trend. Triage is the same rows limited to clients with open flags, in order
 * of clinical urgency (src/lib/flags/urgency.ts).
 */
export async function caseload(ctx: RequestContext, { onlyFlagged }: { onlyFlagged: boolean }) {
  const clinics = ctx.viewer.memberships.map((m) => m.clinicId);
  if (!clinics.length) throw forbidden('Triage and the caseload are for clinic staff.');
  const now = new Date();
  const s = scope(ctx);
  const flags: FlagRow[] = await s.flags()
    .whereIn('clinic_id', clinics)
    .where({ state: 'open' })
    .where((q) => q.whereNull('snoozed_until').orWhereRaw('?? < current_date', ['snoozed_until']));
  const flagged = new Set(flags.map((f) => f.client_id));
  // The caller's clinics only: a therapist who is also someone's carer sees that client elsewhere.
  const clients: ClientRow[] = await s.clients()
    .whereIn('clinic_id', clinics)
    .modify((q) => {
      if (onlyFlagged) q.whereIn('id', [...flagged]);
    })
    .orderBy('display_name');
  const figures = await overviews(s.db, clients, now);
  // Readiness, "no plan on file" and a missing baseline (issue 12): one small read per table.
  const care = await careStatuses(s.db, clients, now);
  await s.listed(onlyFlagged ? 'triage.view' : 'caseload.view', clients);
  const rows = clients.map((c) => {
    const own = flags
      .filter((f) => f.client_id === c.id)
      .map(flagView)
      .sort(compareUrgency);
    return { clientId: c.id, clientName: c.display_name, timeZone: c.time_zone, flags: own, ...figures.get(c.id)!, care: care.get(c.id)! };
  });
  return onlyFlagged ? rows.sort(compareClientsByUrgency) : rows;
}
