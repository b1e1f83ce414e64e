// What triage, the caseload and the client page show about a client's care
// outside the rides: readiness, whether a client at risk has a dysreflexia
// plan on file, and whether a check found no baseline to compare with.
// One read per table for a whole list of clients.
import { assessAdRisk } from '../checks/injury-level';
import type { RequestContext } from '../auth/context';
import { scope, type Db } from '../data';
import type { ClientRow } from '../db/tables';
import { formatDate } from '../time/format';
import { CLEARANCE_DUE_DAYS, clinicCareSettings, type CareSettings } from './care-settings';
import { readinessOf, type Readiness, type ScreeningStatus } from './readiness';
import { localDate } from '../time/local-date';

export interface CareStatus {
  readiness: Readiness;
  /** The newest clearance's review date, when one is on file. */
  clearanceReviewOn: string | null;
  atRisk: boolean;
  /** At risk of autonomic dysreflexia and no plan written. */
  noPlanOnFile: boolean;
  /** A check had blood pressure but no baseline to compare with, and none has been recorded since. */
  baselineNeeded: boolean;
}

type Client = Pick<ClientRow, 'id' | 'clinic_id' | 'time_zone' | 'injury_level' | 'ad_risk' | 'baseline_systolic'>;

export async function careStatuses(knex: Db, clients: Client[], now = new Date()): Promise<Map<string, CareStatus>> {
  const ids = clients.map((c) => c.id);
  if (!ids.length) return new Map();
  const [screenings, clearances, plans, missing] = await Promise.all([
    knex('screening_versions').distinctOn('client_id').whereIn('client_id', ids).orderBy([{ column: 'client_id' }, { column: 'version', order: 'desc' }]).select('client_id', 'items', 'assessed_on'),
    knex('clearances').distinctOn('client_id').whereIn('client_id', ids).orderBy([{ column: 'client_id' }, { column: 'created_at', order: 'desc' }]).select('client_id', 'cleared_on', 'review_on'),
    knex('ad_plans').distinct('client_id').whereIn('client_id', ids).pluck('client_id'),
    knex('checks').distinct('client_id').whereIn('client_id', ids).whereRaw("(evaluation->>'baselineMissing')::boolean").pluck('client_id'),
  ]);
  const screeningOf = new Map(screenings.map((s) => [s.client_id, { assessedOn: s.assessed_on as string, items: s.items as { status: ScreeningStatus }[] }]));
  const clearanceOf = new Map(clearances.map((c) => [c.client_id, { clearedOn: c.cleared_on as string, reviewOn: c.review_on as string }]));
  const planned = new Set(plans);
  const unmeasured = new Set(missing);
  return new Map(
    clients.map((c) => {
      const atRisk = assessAdRisk(c.injury_level, c.ad_risk).atRisk;
      const clearance = clearanceOf.get(c.id) ?? null;
      return [
        c.id,
        {
          readiness: readinessOf({ screening: screeningOf.get(c.id) ?? null, clearance, today: localDate(now, c.time_zone), dueWithinDays: CLEARANCE_DUE_DAYS }),
          clearanceReviewOn: clearance?.reviewOn ?? null,
          atRisk,
          noPlanOnFile: atRisk && !planned.has(c.id),
          baselineNeeded: c.baseline_systolic === null && unmeasured.has(c.id),
        },
      ];
    }),
  );
}

export async function careStatusOf(knex: Db, client: Client, now = new Date()): Promise<CareStatus> {
  return (await careStatuses(knex, [client], now)).get(client.id)!;
}

/** A client's care status and their clinic's care settings, for the record's pages (staff; the read is audited with the page's). */
export async function readCareOf(ctx: RequestContext, clientId: string): Promise<{ status: CareStatus; settings: CareSettings }> {
  const client = await scope(ctx).client(clientId, 'manage', 'client.view');
  return { status: await careStatusOf(client.db, client.row), settings: await clinicCareSettings(client.db, client.clinicId) };
}

/**
 * Digest lines for clearances whose review falls due within 30 days or has
 * passed, by client: what the therapist's daily digest adds to the flags.
 */
export async function clearanceReviewLines(knex: Db, clients: (Client & Pick<ClientRow, 'display_name'>)[], now: Date, localeOf: (c: Client) => string): Promise<Map<string, string>> {
  const statuses = await careStatuses(knex, clients, now);
  const out = new Map<string, string>();
  for (const c of clients) {
    const s = statuses.get(c.id)!;
    const on = s.clearanceReviewOn ? formatDate(s.clearanceReviewOn, localeOf(c), 'date') : '';
    if (s.readiness === 'clearance_due') out.set(c.id, `${c.display_name} — medical clearance due for review on ${on}.`);
    if (s.readiness === 'clearance_expired') out.set(c.id, `${c.display_name} — medical clearance expired on ${on}; a new one is needed.`);
  }
  return out;
}
