// The arithmetic behind a client's progress report, on the page
// (src/pages/reports/[id].astro) and in the PDF (pdf.ts), kept apart from both
// so that it is tested directly and never computed twice.
import { DateTime } from 'luxon';
import { linearTrend } from '../analytics/trend';
import { parseIsoWeek } from '../time/iso-week';
import { localDate } from '../time/local-date';
import { acsmLegCycling, fesEnergyKcal, sessionWorkJ } from './energy';

const WEEK_MS = 7 * 24 * 3600 * 1000;

/** Mean power over several sessions, weighted by active time as each session's own mean is. */
export function weightedPower(sessions: { meanPowerW: number | null; activeS: number }[]): number | null {
  const rated = sessions.filter((s) => s.meanPowerW !== null && s.activeS > 0);
  const weight = rated.reduce((sum, s) => sum + s.activeS, 0);
  return weight > 0 ? rated.reduce((sum, s) => sum + s.meanPowerW! * s.activeS, 0) / weight : null;
}

export const meanOf = (values: number[]): number | null => (values.length ? values.reduce((a, b) => a + b, 0) / values.length : null);

/** How many sessions the "first" and "last" groups hold: four, or fewer so that the two never overlap. */
export const comparedCount = (sessions: number): number => Math.min(4, Math.floor(sessions / 2));

/** Half a year of weeks goes in two tables side by side, so that the report still prints on two pages. */
export function halves<T>(rows: T[]): T[][] {
  if (rows.length <= 13) return [rows];
  const cut = Math.ceil(rows.length / 2);
  return [rows.slice(0, cut), rows.slice(cut)];
}

export function weekOutcome(w: { isoWeek: string; prescribed: number; met: boolean; paused: boolean }, currentIsoWeek: string): string {
  if (w.paused) return 'Paused';
  if (w.isoWeek === currentIsoWeek) return w.met ? 'Met (week under way)' : 'Under way';
  if (w.prescribed === 0) return 'No prescription';
  return w.met ? 'Met' : 'Not met';
}

export const SPARK = { width: 420, height: 130, left: 74, right: 10, top: 10, bottom: 24, font: 12 };
type Point = { t: number; y: number };

/** SVG geometry of a small black-and-white chart over [startMs, endMs], its y axis from 0 to a little above the highest value. */
export function drawSpark(values: Point[], reference: Point[], startMs: number, endMs: number) {
  const top = Math.max(...values.map((p) => p.y), ...reference.map((p) => p.y), 0);
  const yMax = top > 0 ? top * 1.1 : 1;
  const x = (t: number) => SPARK.left + ((t - startMs) / Math.max(1, endMs - startMs)) * (SPARK.width - SPARK.left - SPARK.right);
  const y = (v: number) => SPARK.top + (1 - v / yMax) * (SPARK.height - SPARK.top - SPARK.bottom);
  const path = (pts: Point[]) => pts.map((p, i) => `${i ? 'L' : 'M'}${x(p.t).toFixed(1)} ${y(p.y).toFixed(1)}`).join(' ');
  return {
    line: path(values),
    reference: path(reference),
    dots: values.map((p) => ({ cx: x(p.t).toFixed(1), cy: y(p.y).toFixed(1) })),
    top,
    yTop: y(top).toFixed(1),
    yZero: y(0).toFixed(1),
    xRight: (SPARK.width - SPARK.right).toFixed(1),
  };
}

// ---------------------------------------------------------------------------
// Everything a report shows, computed once from the records that report-data.ts
// loads; the page (src/pages/reports/[id].astro) and the PDF (pdf.ts) only word
// and draw what comes out of `reportFigures`.

export interface ReportSessionInput {
  id: string;
  startedAt: string;
  durationS: number;
  activeS: number;
  meanPowerW: number | null;
  peakPower5sW: number | null;
  workKj: number | null;
  distanceM: number | null;
  currentPerWattMaPerW: number | null;
  /** Long enough to count towards the prescription of its day. */
  counted: boolean;
  /** The usual level the power-drop rule compares this session with. */
  baselineW: number | null;
}

export interface ReportWeekInput {
  isoWeek: string;
  prescribed: number;
  counted: number;
  short: number;
  met: boolean;
  paused: boolean;
}

export interface ReportVersionInput {
  version: number;
  effectiveFrom: string;
}

export interface ReportPauseInput {
  from: string;
  to: string;
  state: string;
}

export interface ReportFlagInput {
  state: string;
  raisedAt: string;
  history: { at: string }[];
}

export interface ReportCheckInput {
  takenAt: string;
  bpBefore: unknown;
  bpDuring: unknown;
  bpAfter: unknown;
  adSymptoms: string[];
  evaluation: Record<string, unknown>;
  recordedBy: { name: string | null };
}

export interface ReportInput<S extends ReportSessionInput, V extends ReportVersionInput, P extends ReportPauseInput, F extends ReportFlagInput, C extends ReportCheckInput, N extends { createdAt: string }> {
  timeZone: string;
  /** First and last local day of the period, both included. */
  from: string;
  to: string;
  /** The client's local date today. */
  today: string;
  /** Every session of the client, oldest first; the period's are picked here. */
  sessions: S[];
  /** The period's ISO weeks, oldest first. */
  weeks: ReportWeekInput[];
  /** Prescription versions, newest first. */
  prescriptions: V[];
  pauses: P[];
  flags: F[];
  /** Newest first. */
  checks: C[];
  /** Newest first. */
  notes: N[];
  energy: { efficiencyPct: number; bodyMassKg: number | null; volitionalControl: boolean | null };
}

export interface CheckFinding {
  kind: 'bp_rise' | 'bp_drop' | 'skin_concern';
  severity: string;
  reason: string;
}

function findingsOf(evaluation: Record<string, unknown>): CheckFinding[] {
  const conditions = evaluation.conditions;
  return Array.isArray(conditions) ? (conditions as CheckFinding[]) : [];
}

/** A live flag is one a therapist still has to act on. */
const liveState = (state: string) => state === 'open' || state === 'acknowledged';

/** Sums that stay null when nothing was there to add. */
const sumOrNull = (values: (number | null)[]) => {
  const present = values.filter((v): v is number => v !== null);
  return present.length ? present.reduce((a, b) => a + b, 0) : null;
};

export interface WeekFigures extends ReportWeekInput {
  monday: string;
  sunday: string;
  outcome: string;
  finished: boolean;
  sessions: number;
  activeMin: number;
  meanPowerW: number | null;
  energyKcal: number | null;
}

export interface BlockAverage {
  activeMinPerWeek: number;
  meanPowerW: number | null;
}

/** A week the first and last averages are taken over. */
export const comparableWeek = (w: { finished: boolean; prescribed: number }) => w.finished && w.prescribed > 0;

export function reportFigures<S extends ReportSessionInput, V extends ReportVersionInput, P extends ReportPauseInput, F extends ReportFlagInput, C extends ReportCheckInput, N extends { createdAt: string }>(
  r: ReportInput<S, V, P, F, C, N>,
) {
  const tz = r.timeZone;
  const dayOf = (instant: string) => localDate(instant, tz);
  const inPeriod = (instant: string) => {
    const d = dayOf(instant);
    return d >= r.from && d <= r.to;
  };
  const startMs = DateTime.fromISO(r.from, { zone: tz }).toMillis();
  const endMs = DateTime.fromISO(r.to, { zone: tz }).endOf('day').toMillis();

  const s = r.sessions.filter((x) => inPeriod(x.startedAt));
  const kcalOf = (x: ReportSessionInput) => {
    const work = sessionWorkJ(x);
    return work === null ? null : fesEnergyKcal(work, r.energy.efficiencyPct);
  };
  const acsmOf = (x: ReportSessionInput) =>
    r.energy.volitionalControl && r.energy.bodyMassKg && x.meanPowerW !== null ? acsmLegCycling(x.meanPowerW, r.energy.bodyMassKg).kcalPerMin * (x.activeS / 60) : null;

  const half = comparedCount(s.length);
  const activeS = s.reduce((sum, x) => sum + x.activeS, 0);
  // A session too short to count is no one's highest value.
  const peak = s.reduce<S | null>((best, x) => (x.counted && x.peakPower5sW !== null && (best === null || x.peakPower5sW > best.peakPower5sW!) ? x : best), null);
  const cpw = s.filter((x) => x.currentPerWattMaPerW !== null).map((x) => ({ t: Date.parse(x.startedAt), y: x.currentPerWattMaPerW! }));
  const cpwTrend = cpw.length >= 3 ? linearTrend(cpw.map((p) => ({ x: (p.t - endMs) / WEEK_MS, y: p.y }))) : null;
  const cpwHalf = comparedCount(cpw.length);

  // The week that holds the period's last day is under way when that day is today.
  const lastWeek = r.weeks[r.weeks.length - 1]?.isoWeek ?? '';
  const currentWeek = r.to >= r.today ? lastWeek : '';
  const weeks: WeekFigures[] = r.weeks.map((w) => {
    const { monday, sunday } = parseIsoWeek(w.isoWeek);
    const own = s.filter((x) => {
      const d = dayOf(x.startedAt);
      return d >= monday && d <= sunday;
    });
    return {
      ...w,
      monday,
      sunday,
      outcome: weekOutcome(w, currentWeek),
      finished: sunday < r.today && sunday <= r.to,
      sessions: own.length,
      activeMin: own.reduce((sum, x) => sum + x.activeS, 0) / 60,
      meanPowerW: weightedPower(own),
      energyKcal: sumOrNull(own.map(kcalOf)),
    };
  });
  // First and last blocks of up to four finished weeks that asked for sessions
  // (weeks before the program, without a prescription or wholly paused are left out).
  const comparable = weeks.filter(comparableWeek);
  const blockWeeks = comparedCount(comparable.length);
  const block = (list: WeekFigures[]): BlockAverage => {
    const within = s.filter((x) => list.some((w) => dayOf(x.startedAt) >= w.monday && dayOf(x.startedAt) <= w.sunday));
    return { activeMinPerWeek: list.reduce((sum, w) => sum + w.activeMin, 0) / list.length, meanPowerW: weightedPower(within) };
  };
  const firstBlock = blockWeeks ? block(comparable.slice(0, blockWeeks)) : null;
  const lastBlock = blockWeeks ? block(comparable.slice(-blockWeeks)) : null;

  const judged = r.weeks.filter((w) => w.isoWeek !== currentWeek && !w.paused && w.prescribed > 0);
  const changes = r.prescriptions.filter((v) => v.effectiveFrom >= r.from && v.effectiveFrom <= r.to);
  const atStart = r.prescriptions.find((v) => v.effectiveFrom < r.from) ?? null;

  const checks = r.checks.filter((c) => inPeriod(c.takenAt)).reverse();
  const findings = checks.flatMap((c) => findingsOf(c.evaluation).map((f) => ({ ...f, takenAt: c.takenAt, by: c.recordedBy.name })));
  const countOf = (kind: CheckFinding['kind']) => findings.filter((f) => f.kind === kind).length;

  const energyPerSession = s.map(kcalOf);
  const withEnergy = energyPerSession.filter((v) => v !== null).length;
  const energyKcal = sumOrNull(energyPerSession);
  const acsmKcal = sumOrNull(s.map(acsmOf));
  const periodPower = weightedPower(s);

  return {
    period: { from: r.from, to: r.to, startMs, endMs, weeks: r.weeks.length },
    sessions: {
      list: s,
      count: s.length,
      counted: s.filter((x) => x.counted).length,
      activeS,
      meanActiveS: s.length ? activeS / s.length : null,
      half,
      firstPower: half ? weightedPower(s.slice(0, half)) : null,
      lastPower: half ? weightedPower(s.slice(-half)) : null,
      meanPowerW: periodPower,
      peak,
      distanceM: s.reduce((sum, x) => sum + (x.distanceM ?? 0), 0),
      cpwHalf,
      firstCpw: cpwHalf ? meanOf(cpw.slice(0, cpwHalf).map((p) => p.y)) : null,
      lastCpw: cpwHalf ? meanOf(cpw.slice(-cpwHalf).map((p) => p.y)) : null,
      cpwPerWeek: cpwTrend?.slope ?? null,
    },
    series: {
      power: s.filter((x) => x.meanPowerW !== null).map((x) => ({ t: Date.parse(x.startedAt), y: x.meanPowerW! })),
      powerReference: s.filter((x) => x.baselineW !== null).map((x) => ({ t: Date.parse(x.startedAt), y: x.baselineW! })),
      currentPerWatt: cpw,
    },
    weeks,
    blocks: firstBlock && lastBlock
      ? {
          weeks: blockWeeks,
          first: firstBlock,
          last: lastBlock,
          activeMinChange: lastBlock.activeMinPerWeek - firstBlock.activeMinPerWeek,
          powerChangeW: firstBlock.meanPowerW !== null && lastBlock.meanPowerW !== null ? lastBlock.meanPowerW - firstBlock.meanPowerW : null,
          powerChangePct: firstBlock.meanPowerW && lastBlock.meanPowerW !== null ? ((lastBlock.meanPowerW - firstBlock.meanPowerW) / firstBlock.meanPowerW) * 100 : null,
        }
      : null,
    energy: {
      efficiencyPct: r.energy.efficiencyPct,
      sessionsWithEstimate: withEnergy,
      totalKcal: energyKcal,
      perSessionKcal: energyKcal !== null && withEnergy ? energyKcal / withEnergy : null,
      // Only for riders who also pedal by their own effort, and only with a body mass.
      acsm:
        r.energy.volitionalControl && r.energy.bodyMassKg && periodPower !== null
          ? { bodyMassKg: r.energy.bodyMassKg, atPowerW: periodPower, ...acsmLegCycling(periodPower, r.energy.bodyMassKg), totalKcal: acsmKcal }
          : null,
    },
    adherence: { currentWeek, judged: judged.length, met: judged.filter((w) => w.met).length },
    pauses: r.pauses.filter((p) => p.state !== 'cancelled' && p.to >= r.from && p.from <= r.to).reverse(),
    prescription: { changes, atStart },
    flags: r.flags.filter((f) => liveState(f.state) || inPeriod(f.raisedAt) || f.history.some((h) => inPeriod(h.at))),
    checks: {
      list: checks,
      withBp: checks.filter((c) => c.bpBefore || c.bpDuring || c.bpAfter).length,
      withSymptoms: checks.filter((c) => c.adSymptoms.length > 0).length,
      bpRise: countOf('bp_rise'),
      bpDrop: countOf('bp_drop'),
      skin: countOf('skin_concern'),
      findings,
    },
    notes: r.notes.filter((n) => inPeriod(n.createdAt)).reverse(),
  };
}
export type ReportFigures<S extends ReportSessionInput = ReportSessionInput> = ReturnType<typeof reportFigures<S, ReportVersionInput, ReportPauseInput, ReportFlagInput, ReportCheckInput, { createdAt: string }>>;
