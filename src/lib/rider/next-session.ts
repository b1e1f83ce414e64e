// When the rider's next session is due. The week's remaining sessions are
// spread over its remaining days: the next one is due once the rider has
// rested about 7 ÷ (sessions per week) days since the last one (rounded, at
// least one day), but no later than the day that still leaves the rest of
// the week evenly spaced for the sessions still to do. So 3 a week comes out
// as Monday, Wednesday, Friday, and only one session is ever due on a day.
import { addDays, isoWeekday, localDate, mondayOf } from '../time/local-date';
import { firstUnpausedOnOrAfter, isPaused, type Pause } from './pauses';

export interface NextSessionInput {
  timeZone: string;
  now: Date | string;
  sessionsPerWeek: number;
  /** Sessions counted towards the prescription in the ISO week that holds `now`. */
  countedThisWeek: number;
  lastSessionAt: Date | string | null;
  pauses: Pause[];
}

export type NextSessionReason =
  | 'no_target' // no sessions prescribed
  | 'paused' // today is in a pause; due the first day after it (null for an open-ended pause)
  | 'week_met' // this week's target is met; due in a later week
  | 'due_today'
  | 'due'; // due on a later day

export interface NextSessionDue {
  dueLocalDate: string | null;
  reason: NextSessionReason;
  remainingThisWeek: number;
}

export function nextSessionDue(input: NextSessionInput): NextSessionDue {
  const { timeZone, sessionsPerWeek, pauses } = input;
  const today = localDate(input.now, timeZone);
  const remaining = Math.max(0, sessionsPerWeek - input.countedThisWeek);
  if (!(sessionsPerWeek > 0)) return { dueLocalDate: null, reason: 'no_target', remainingThisWeek: 0 };

  if (isPaused(today, pauses)) {
    return { dueLocalDate: firstUnpausedOnOrAfter(today, pauses), reason: 'paused', remainingThisWeek: remaining };
  }

  const lastDate = input.lastSessionAt === null ? null : localDate(input.lastSessionAt, timeZone);
  const restDays = Math.max(1, Math.round(7 / sessionsPerWeek));
  const earliest = lastDate === null ? today : addDays(lastDate, restDays);

  if (remaining > 0) {
    const days = daysUntilSunday(today).filter((d) => d !== lastDate && !isPaused(d, pauses));
    if (days.length > 0) {
      const due = pick(days, remaining, earliest);
      return { dueLocalDate: due, reason: due === today ? 'due_today' : 'due', remainingThisWeek: remaining };
    }
  }

  const due = firstDayOfLaterWeek(addDays(mondayOf(today), 7), sessionsPerWeek, earliest, pauses);
  return { dueLocalDate: due, reason: remaining === 0 ? 'week_met' : 'due', remainingThisWeek: remaining };
}

function daysUntilSunday(date: string): string[] {
  const out: string[] = [];
  for (let i = 0; i <= 7 - isoWeekday(date); i++) out.push(addDays(date, i));
  return out;
}

/** `days` are the open days left in a week, in order; `n` sessions still to place. */
function pick(days: string[], n: number, earliest: string): string {
  const rested = days.findIndex((d) => d >= earliest);
  const latestEvenStart = Math.max(0, Math.floor(days.length / n) - 1);
  return days[rested === -1 ? latestEvenStart : Math.min(rested, latestEvenStart)];
}

function firstDayOfLaterWeek(monday: string, sessionsPerWeek: number, earliest: string, pauses: Pause[]): string | null {
  const start = firstUnpausedOnOrAfter(monday, pauses);
  if (start === null) return null;
  const days = daysUntilSunday(start).filter((d) => !isPaused(d, pauses));
  return pick(days, sessionsPerWeek, earliest);
}
