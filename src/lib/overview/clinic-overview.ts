// The clinic overview for its staff: one read of the clinic's clients, their
// histories and open flags, one audit entry, and the figures of figures.ts.
import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import type { ClientRow, FlagRow } from '../db/tables';
import { toCsv } from '../exports/csv';
import { FLAG_KIND_WORDS } from '../flags/words';
import { roundTo } from '../analytics/round';
import { loadHistories } from '../supervision/history';
import { overviewOf } from '../supervision/overview';
import { localDate } from '../time/local-date';
import { clinicOverviewFigures, OVERVIEW_WEEKS } from './figures';

export async function clinicOverview(ctx: RequestContext, clinicId?: string, now = new Date()) {
  const grant = scope(ctx).clinic(['admin', 'therapist'], clinicId);
  const clinic = await grant.clinic();
  const rows: ClientRow[] = await grant.db<ClientRow>('clients').orderBy('display_name');
  const histories = await loadHistories(grant.db, rows);
  // Open and not snoozed: what triage shows.
  const flags: FlagRow[] = await grant.db<FlagRow>('flags')
    .where({ state: 'open' })
    .where((q) => q.whereNull('snoozed_until').orWhereRaw('?? < current_date', ['snoozed_until']));
  await grant.audit({ action: 'clinic.overview', detail: { clients: rows.length } });
  const inputs = histories.map((h) => ({
    id: h.client.id,
    name: h.client.display_name,
    timeZone: h.client.time_zone,
    programStart: h.client.program_start,
    prescriptions: h.prescriptions,
    pauses: h.pauses,
    sessions: h.sessions.map((s) => ({ startedAt: s.startedAt, activeS: s.row.active_s, meanPowerW: s.meanPowerW })),
    adherence4wPct: overviewOf(h, now, 4).adherence.adherence4wPct,
    openFlagKinds: [...new Set(flags.filter((f) => f.client_id === h.client.id).map((f) => f.kind))],
  }));
  const figures = clinicOverviewFigures(inputs, now, clinic.time_zone);
  return {
    clinic: { id: clinic.id as string, name: clinic.name as string, timeZone: clinic.time_zone as string },
    generatedAt: now.toISOString(),
    names: Object.fromEntries(rows.map((r) => [r.id, r.display_name])) as Record<string, string>,
    figures,
  };
}
export type ClinicOverview = Awaited<ReturnType<typeof clinicOverview>>;

/** The overview as CSV, one row per client with the figures behind each chart. */
export async function clinicOverviewCsv(ctx: RequestContext, clinicId?: string) {
  const o = await clinicOverview(ctx, clinicId);
  const header = [
    'client_id',
    'client',
    'prescription_in_effect',
    'paused_today',
    'adherence_4_weeks_pct',
    'open_flags',
    `weeks_with_sessions_of_last_${OVERVIEW_WEEKS}`,
    `sessions_in_last_${OVERVIEW_WEEKS}_weeks`,
    'power_sessions_compared',
    'mean_power_first_w',
    'mean_power_last_w',
    'mean_power_change_w',
    'mean_power_change_pct',
    'last_session_utc',
    'days_since_last_session',
  ];
  const round = (v: number | null | undefined) => (v === null || v === undefined ? null : roundTo(v, 1));
  const rows = o.figures.perClient.map((c) => [
    c.clientId,
    c.name,
    c.active ? 'yes' : 'no',
    c.paused ? 'yes' : 'no',
    c.adherence4wPct,
    c.openFlagKinds.map((k) => FLAG_KIND_WORDS[k]).join('; '),
    c.weeksWithSessions,
    c.sessionsInWeeks,
    c.power?.sessions ?? null,
    round(c.power?.firstW),
    round(c.power?.lastW),
    round(c.power?.changeW),
    round(c.power?.changePct),
    c.lastSessionAt,
    c.daysSinceLastSession,
  ]);
  return { filename: `kinloop-clinic-overview-${localDate(new Date(o.generatedAt), o.clinic.timeZone)}.csv`, text: toCsv(header, rows) };
}
