// Adherence from weeks worked out once and stored, so that a list of a
// thousand clients never replays anyone's whole history. Two halves, both
// pure:
// - `weeksToStore` lays out a client's program week by week with the same
//   calendar computeAdherence uses (./calendar.ts), from the first week with a
//   session or a prescription version to the later of the week of `now` and
//   the week of the last session, each week with the streak as it stood at
//   its end (`run`);
// - `adherenceFromStored` answers exactly what computeAdherence answers for
//   any later `now`, reading only the weeks it shows, the four finished weeks
//   the adherence figure needs and one streak run. A week outside the stored
//   range has no session (the range covers every week that has one), so its
//   figures come from the prescription and the pauses alone.
// The stored weeks hold only as long as the sessions, prescriptions, pauses,
// time zone and count threshold they were made from: the store
// (src/lib/supervision/adherence-store.ts) knows when they changed.
import { isoWeekOf, nextWeek, previousWeek, weeksEndingAt, type IsoWeek } from '../time/iso-week';
import { localDate } from '../time/local-date';
import { createAdherenceCalendar, type AdherenceCalendar } from './calendar';
import { prescriptionTimeline } from './prescription';
import { DEFAULT_COUNT_THRESHOLD_PCT } from './session-status';
import { adherencePct } from './streak';
import type { Adherence, AdherenceWeek, Pause, PrescriptionVersion, SessionForAdherence } from './types';
import { DEFAULT_ADHERENCE_WEEKS } from './compute';

/** One week of a client's program as stored. */
export interface StoredWeek {
  /** local date of the week's Monday */
  monday: string;
  /** every session of the week, counted or not */
  sessions: number;
  counted: number;
  short: number;
  prescribed: number;
  met: boolean;
  paused: boolean;
  hasPrescription: boolean;
  /** the streak at the end of this week: met weeks back to the last unmet or unprescribed one, paused weeks skipped */
  run: number;
}

export interface StoredWeeks {
  /** Monday of the first stored week, null when nothing is stored (no session, no prescription) */
  first: string | null;
  /** Monday of the last stored week */
  through: string | null;
  weeks: StoredWeek[];
}

interface ProgramInput {
  timeZone: string;
  prescriptions: PrescriptionVersion[];
  pauses: Pause[];
  countThresholdPct?: number;
}

const calendarOf = <S extends SessionForAdherence>(p: ProgramInput, sessions: S[]) =>
  createAdherenceCalendar({
    timeZone: p.timeZone,
    prescriptions: p.prescriptions,
    pauses: p.pauses,
    sessions,
    countThresholdPct: p.countThresholdPct ?? DEFAULT_COUNT_THRESHOLD_PCT,
  });

/** The first date a version asking for sessions takes effect (the calendar's programStart, without building one). */
function programStartOf(versions: PrescriptionVersion[]): string | null {
  return prescriptionTimeline(versions).programStart;
}

const runAfter = (previousRun: number, w: Pick<AdherenceWeek, 'hasPrescription' | 'paused' | 'met'>) =>
  !w.hasPrescription ? 0 : w.paused ? previousRun : w.met ? previousRun + 1 : 0;

/** The weeks to store for a client's whole history, as of `now`. */
export function weeksToStore(input: ProgramInput & { sessions: SessionForAdherence[]; now: string }): StoredWeeks {
  const calendar = calendarOf(input, input.sessions);
  const today = localDate(input.now, input.timeZone);
  const mondays = [
    ...calendar.sessions.map((s) => isoWeekOf(s.localDate, input.timeZone).monday),
    ...input.prescriptions.map((p) => isoWeekOf(p.effectiveFrom, input.timeZone).monday),
  ];
  if (!mondays.length) return { first: null, through: null, weeks: [] };
  const first = mondays.reduce((a, b) => (b < a ? b : a));
  const lastSession = calendar.sessions.at(-1);
  const current = isoWeekOf(today, input.timeZone).monday;
  const through = lastSession && lastSession.localDate > current ? isoWeekOf(lastSession.localDate, input.timeZone).monday : current;
  const weeks: StoredWeek[] = [];
  let run = 0;
  for (let week = isoWeekOf(first, input.timeZone); week.monday <= through; week = nextWeek(week)) {
    const w = calendar.week(week, today);
    run = runAfter(run, w);
    weeks.push({
      monday: w.monday,
      sessions: calendar.sessionsInWeek(w.isoWeek).length,
      counted: w.counted,
      short: w.short,
      prescribed: w.prescribed,
      met: w.met,
      paused: w.paused,
      hasPrescription: w.hasPrescription,
      run,
    });
  }
  // A stored range that starts after `through` (every session and version in the future) still holds its weeks.
  return { first, through: weeks.length ? through : null, weeks };
}

/** A stored week the caller did not pass in was needed: read the client's stored weeks from `from` on and ask again. */
export class StoredWeeksMissing extends Error {
  constructor(readonly from: string) {
    super(`stored week ${from} was not read`);
  }
}

export interface StoredAdherenceInput extends ProgramInput {
  now: string;
  weeks?: number;
  stored: { first: string | null; through: string | null; weeks: Map<string, StoredWeek> };
}

/** computeAdherence's answer, from stored weeks. Throws StoredWeeksMissing when a stored week it needs is not in `stored.weeks`. */
export function adherenceFromStored(input: StoredAdherenceInput): Adherence {
  const weekCount = input.weeks ?? DEFAULT_ADHERENCE_WEEKS;
  if (!Number.isInteger(weekCount) || weekCount < 1) throw new RangeError(`weeks must be a positive integer: ${weekCount}`);
  const { first, through } = input.stored;
  // Only weeks outside the stored range need the calendar; most reads never build it.
  let built: AdherenceCalendar<SessionForAdherence> | null = null;
  const calendar = () => (built ??= calendarOf(input, []));
  const today = localDate(input.now, input.timeZone);
  const current = isoWeekOf(today, input.timeZone);
  const isStored = (w: IsoWeek) => first !== null && through !== null && w.monday >= first && w.monday <= through;
  const storedWeek = (w: IsoWeek) => {
    const row = input.stored.weeks.get(w.monday);
    if (!row) throw new StoredWeeksMissing(w.monday);
    return row;
  };

  const statusOf = (week: IsoWeek): AdherenceWeek => {
    if (!isStored(week)) return calendar().week(week, today);
    const row = storedWeek(week);
    return {
      isoWeek: week.isoWeek,
      monday: week.monday,
      prescribed: row.prescribed,
      counted: row.counted,
      short: row.short,
      met: row.met,
      paused: row.paused,
      finished: week.sunday < today,
      hasPrescription: row.hasPrescription,
    };
  };

  // The streak at the end of `week`: stored, or carried on from the last stored week through weeks without sessions.
  const runAt = (week: IsoWeek): number => {
    if (first === null || through === null || week.monday < first) return 0;
    if (week.monday <= through) return storedWeek(week).run;
    const last = isoWeekOf(through, input.timeZone);
    let run = storedWeek(last).run;
    for (let w = nextWeek(last); w.monday <= week.monday; w = nextWeek(w)) run = runAfter(run, calendar().week(w, today));
    return run;
  };

  const thisWeek = statusOf(current);
  const streakWeeks = thisWeek.hasPrescription ? (thisWeek.met ? 1 : 0) + runAt(previousWeek(current)) : 0;

  // The last four finished, unpaused weeks with a prescription (./streak.ts, lastJudgedWeeks).
  const judged: AdherenceWeek[] = [];
  const start = programStartOf(input.prescriptions);
  if (start) {
    for (let week = previousWeek(current); judged.length < 4 && week.sunday >= start; week = previousWeek(week)) {
      const status = statusOf(week);
      if (status.hasPrescription && !status.paused) judged.push(status);
    }
  }

  return {
    weeks: weeksEndingAt(current, weekCount).map(statusOf),
    streakWeeks,
    adherence4wPct: adherencePct(judged),
  };
}

/** The Monday from which `adherenceFromStored` usually finds every stored week it needs: the weeks shown and a few before. */
export function storedWeeksFrom(now: string, timeZone: string, weeks = DEFAULT_ADHERENCE_WEEKS): string {
  const current = isoWeekOf(localDate(now, timeZone), timeZone);
  return weeksEndingAt(current, Math.max(weeks, 6) + 2)[0].monday;
}
