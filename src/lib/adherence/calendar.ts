// A client's program laid out in ISO weeks of their time zone. Rules from the
// Kinloop supervision issue:
// - a session belongs to the week of its local start date;
// - the version in effect on the week's Sunday sets the week's target;
// - the target is prorated by the week's days that are both prescribed and
//   unpaused, rounded up: ceil(sessionsPerWeek × days / 7). So the week in
//   which the program starts counts only the days from the effective date, like
//   a partly paused week counts only its unpaused days;
// - a week with any paused day is paused: neither met nor missed;
// - a week whose Sunday has no prescription is not counted.
import { datesOfWeek, isoWeekOf, type IsoWeek } from '../time/iso-week';
import { localDate } from '../time/local-date';
import { pausedOn } from './pause';
import { prescriptionTimeline, type PrescriptionTimeline } from './prescription';
import { sessionStatus, type SessionStatus } from './session-status';
import type { AdherenceWeek, Pause, PrescriptionVersion, SessionForAdherence } from './types';

export interface PlacedSession<S extends SessionForAdherence> {
  session: S;
  startMs: number;
  localDate: string;
  isoWeek: string;
  status: SessionStatus;
  /** True when the session's local date lies in a pause. */
  paused: boolean;
}

export interface CalendarInput<S extends SessionForAdherence> {
  timeZone: string;
  prescriptions: PrescriptionVersion[];
  pauses: Pause[];
  sessions: S[];
  countThresholdPct: number;
}

export interface AdherenceCalendar<S extends SessionForAdherence> {
  timeZone: string;
  timeline: PrescriptionTimeline;
  isPaused(date: string): boolean;
  /** All sessions, ordered by start (then id). */
  sessions: PlacedSession<S>[];
  sessionsInWeek(isoWeek: string): PlacedSession<S>[];
  /** The week as seen on local date `today` (which decides `finished`). */
  week(week: IsoWeek, today: string): AdherenceWeek;
}

export function createAdherenceCalendar<S extends SessionForAdherence>(
  input: CalendarInput<S>,
): AdherenceCalendar<S> {
  const timeline = prescriptionTimeline(input.prescriptions);
  const isPaused = pausedOn(input.pauses);

  const sessions = input.sessions
    .map((session): PlacedSession<S> => {
      const startMs = Date.parse(session.startedAt);
      if (Number.isNaN(startMs)) throw new RangeError(`Session ${session.id} has no valid startedAt`);
      const date = localDate(session.startedAt, input.timeZone);
      return {
        session,
        startMs,
        localDate: date,
        isoWeek: isoWeekOf(date, input.timeZone).isoWeek,
        status: sessionStatus(session.durationS, timeline.versionOn(date), input.countThresholdPct),
        paused: isPaused(date),
      };
    })
    .sort((a, b) => a.startMs - b.startMs || a.session.id.localeCompare(b.session.id));

  const byWeek = new Map<string, PlacedSession<S>[]>();
  for (const placed of sessions) {
    const list = byWeek.get(placed.isoWeek) ?? [];
    list.push(placed);
    byWeek.set(placed.isoWeek, list);
  }
  const sessionsInWeek = (isoWeek: string) => byWeek.get(isoWeek) ?? [];

  const week = (isoWeek: IsoWeek, today: string): AdherenceWeek => {
    const days = datesOfWeek(isoWeek);
    const sundayVersion = timeline.versionOn(isoWeek.sunday);
    const hasPrescription = (sundayVersion?.sessionsPerWeek ?? 0) > 0;
    const paused = days.some(isPaused);
    const programDays = days.filter((d) => timeline.prescribedOn(d) && !isPaused(d)).length;
    const prescribed = hasPrescription ? Math.ceil((sundayVersion!.sessionsPerWeek * programDays) / 7) : 0;
    const inWeek = sessionsInWeek(isoWeek.isoWeek);
    const counted = inWeek.filter((s) => s.status === 'counted').length;
    return {
      isoWeek: isoWeek.isoWeek,
      monday: isoWeek.monday,
      prescribed,
      counted,
      short: inWeek.filter((s) => s.status === 'short').length,
      met: hasPrescription && !paused && counted >= prescribed,
      paused,
      finished: isoWeek.sunday < today,
      hasPrescription,
    };
  };

  return { timeZone: input.timeZone, timeline, isPaused, sessions, sessionsInWeek, week };
}
