// The clinic overview's figures: the caseload at a glance, each figure with the
// clients behind it so the page can link to them. Pure: `now` is passed in.
import { median } from '../analytics/median';
import { pausedOn } from '../adherence/pause';
import { prescriptionTimeline } from '../adherence/prescription';
import type { Pause, PrescriptionVersion } from '../adherence/types';
import { FLAG_KINDS, type FlagKind } from '../flags/types';
import { FLAG_KIND_WORDS } from '../flags/words';
import { comparedCount, weightedPower } from '../reports/figures';
import { isoWeekOf, weeksEndingAt } from '../time/iso-week';
import { daysFrom, localDate } from '../time/local-date';

export interface OverviewClientInput {
  id: string;
  name: string;
  timeZone: string;
  programStart: string | null;
  prescriptions: PrescriptionVersion[];
  pauses: Pause[];
  /** Oldest first. */
  sessions: { startedAt: string; activeS: number; meanPowerW: number | null }[];
  adherence4wPct: number | null;
  openFlagKinds: FlagKind[];
}

export const QUIET_DAYS = 14;
export const OVERVIEW_WEEKS = 26;

export const ADHERENCE_BANDS = [
  { key: 'adherence:100', label: '100 %', test: (p: number) => p >= 100 },
  { key: 'adherence:80-99', label: '80–99 %', test: (p: number) => p >= 80 && p < 100 },
  { key: 'adherence:50-79', label: '50–79 %', test: (p: number) => p >= 50 && p < 80 },
  { key: 'adherence:0-49', label: 'Under 50 %', test: (p: number) => p < 50 },
] as const;

export interface ClientGroup {
  key: string;
  label: string;
  clientIds: string[];
}


export function clinicOverviewFigures(clients: OverviewClientInput[], now: Date, clinicZone: string) {
  const todayOf = (c: OverviewClientInput) => localDate(now, c.timeZone);
  const active = clients.filter((c) => prescriptionTimeline(c.prescriptions).prescribedOn(todayOf(c)));
  const paused = active.filter((c) => pausedOn(c.pauses)(todayOf(c)));

  const adherence = [
    ...ADHERENCE_BANDS.map((b) => ({ key: b.key, label: b.label, clientIds: active.filter((c) => c.adherence4wPct !== null && b.test(c.adherence4wPct)).map((c) => c.id) })),
    { key: 'adherence:none', label: 'No finished week to judge yet', clientIds: active.filter((c) => c.adherence4wPct === null).map((c) => c.id) },
  ];

  const flags = FLAG_KINDS.map((kind) => ({ key: `flag:${kind}`, kind, clientIds: clients.filter((c) => c.openFlagKinds.includes(kind)).map((c) => c.id) }));

  const weeks = weeksEndingAt(isoWeekOf(now, clinicZone), OVERVIEW_WEEKS).map((w) => ({ key: `week:${w.isoWeek}`, isoWeek: w.isoWeek, monday: w.monday, sessions: 0, clientIds: [] as string[] }));
  const byWeek = new Map(weeks.map((w) => [w.isoWeek, w]));
  for (const c of clients) {
    for (const s of c.sessions) {
      const week = byWeek.get(isoWeekOf(s.startedAt, c.timeZone).isoWeek);
      if (!week) continue;
      week.sessions++;
      if (!week.clientIds.includes(c.id)) week.clientIds.push(c.id);
    }
  }

  // Mean power of the first and last sessions since the program started (four, or fewer so the two never overlap).
  const power = clients.flatMap((c) => {
    const start = c.programStart ?? prescriptionTimeline(c.prescriptions).programStart;
    const since = c.sessions.filter((s) => s.meanPowerW !== null && (!start || localDate(s.startedAt, c.timeZone) >= start));
    const n = comparedCount(since.length);
    if (!n) return [];
    const first = weightedPower(since.slice(0, n))!;
    const last = weightedPower(since.slice(-n))!;
    return [{ clientId: c.id, sessions: n, firstW: first, lastW: last, changeW: last - first, changePct: first > 0 ? ((last - first) / first) * 100 : null }];
  });
  const pcts = power.map((p) => p.changePct).filter((v): v is number => v !== null);

  const powerOf = new Map(power.map((p) => [p.clientId, p]));
  const activeIds = new Set(active.map((c) => c.id));
  const perClient = clients.map((c) => {
    const last = c.sessions[c.sessions.length - 1];
    const inWeeks = weeks.filter((w) => w.clientIds.includes(c.id));
    return {
      clientId: c.id,
      name: c.name,
      active: activeIds.has(c.id),
      paused: pausedOn(c.pauses)(todayOf(c)),
      adherence4wPct: c.adherence4wPct,
      openFlagKinds: c.openFlagKinds,
      weeksWithSessions: inWeeks.length,
      sessionsInWeeks: c.sessions.filter((s) => byWeek.has(isoWeekOf(s.startedAt, c.timeZone).isoWeek)).length,
      power: powerOf.get(c.id) ?? null,
      lastSessionAt: last?.startedAt ?? null,
      daysSinceLastSession: last ? daysFrom(localDate(last.startedAt, c.timeZone), todayOf(c)) : null,
    };
  });
  const quiet = perClient.filter((c) => c.active && (c.daysSinceLastSession === null || c.daysSinceLastSession > QUIET_DAYS));

  const groups: ClientGroup[] = [
    { key: 'active', label: 'Clients with a prescription in effect today', clientIds: active.map((c) => c.id) },
    { key: 'paused', label: 'Clients whose program is paused today', clientIds: paused.map((c) => c.id) },
    ...adherence.map((a) => ({ key: a.key, label: `4-week adherence ${a.label === 'No finished week to judge yet' ? 'not judged yet' : a.label}`, clientIds: a.clientIds })),
    ...flags.map((f) => ({ key: f.key, label: `Open ${FLAG_KIND_WORDS[f.kind].toLowerCase()} flag`, clientIds: f.clientIds })),
    ...weeks.map((w) => ({ key: w.key, label: `Sessions in the week from ${w.monday}`, clientIds: w.clientIds })),
    { key: 'power', label: 'Clients with a mean power change since the program start', clientIds: power.map((p) => p.clientId) },
    { key: 'quiet', label: `Active clients without a session in the last ${QUIET_DAYS} days`, clientIds: quiet.map((q) => q.clientId) },
  ];

  return {
    clients: clients.length,
    active: active.length,
    paused: paused.length,
    adherence,
    flags,
    weeks,
    power: {
      clients: power,
      medianChangeW: median(power.map((p) => p.changeW)),
      medianChangePct: median(pcts),
    },
    quiet,
    perClient,
    groups,
  };
}
export type ClinicOverviewFigures = ReturnType<typeof clinicOverviewFigures>;
