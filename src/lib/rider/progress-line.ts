// One encouraging, factual sentence for the rider's home screen comparing the
// past month with the first month of the program. It reports a gain in active
// minutes per ride, else a gain in mean power, else steady active minutes; when
// both have fallen it states the rides completed instead, because a rider's
// home screen is not where a decline is judged (the therapist sees the trends).
// No medical advice. Null until both months hold enough rides to compare.
import { addDays, addMonths, localDate } from '../time/local-date';
import type { RiderSession } from './types';

type LineInput = Pick<RiderSession, 'startedAt' | 'activeS' | 'meanPowerW'>;

/** Fewer rides than this in either month make a mean too noisy to report. */
export const MIN_RIDES_PER_MONTH = 3;

/** `programStart` is the program's first local date, 'YYYY-MM-DD'. */
export function progressLine(sessions: LineInput[], programStart: string, now: Date | string, timeZone: string): string | null {
  const today = localDate(now, timeZone);
  const firstEnd = addMonths(programStart, 1);
  const latestStart = addDays(addMonths(today, -1), 1);
  if (latestStart < firstEnd) return null;

  const dated = sessions
    .filter((s) => s.startedAt !== null)
    .map((s) => ({ ...s, date: localDate(s.startedAt as string, timeZone) }))
    .filter((s) => s.date >= programStart && s.date <= today);
  const first = dated.filter((s) => s.date < firstEnd);
  const latest = dated.filter((s) => s.date >= latestStart);
  if (first.length < MIN_RIDES_PER_MONTH || latest.length < MIN_RIDES_PER_MONTH) return null;

  const firstMinutes = Math.round(mean(first.map((s) => s.activeS / 60)));
  const latestMinutes = Math.round(mean(latest.map((s) => s.activeS / 60)));
  if (latestMinutes > firstMinutes) {
    return `Over the past month your sessions averaged ${minutes(latestMinutes)}, up from ${firstMinutes} in your first month.`;
  }

  const firstPower = meanPower(first);
  const latestPower = meanPower(latest);
  if (firstPower !== null && latestPower !== null && latestPower > firstPower) {
    return `Over the past month your sessions averaged ${latestPower} watts of power, up from ${firstPower} in your first month.`;
  }

  if (latestMinutes === firstMinutes) {
    return `Over the past month your sessions averaged ${minutes(latestMinutes)}, about the same as in your first month.`;
  }
  return `You have completed ${dated.length} ${dated.length === 1 ? 'session' : 'sessions'} since your program started.`;
}

function mean(values: number[]): number {
  return values.reduce((a, b) => a + b, 0) / values.length;
}

/** Whole watts, weighted by active time; null with too few rides that have power. */
function meanPower(rides: LineInput[]): number | null {
  const withPower = rides.filter((s) => s.meanPowerW !== null && s.activeS > 0);
  if (withPower.length < MIN_RIDES_PER_MONTH) return null;
  const weight = withPower.reduce((a, s) => a + s.activeS, 0);
  return Math.round(withPower.reduce((a, s) => a + (s.meanPowerW as number) * s.activeS, 0) / weight);
}

function minutes(n: number): string {
  return `${n} active ${n === 1 ? 'minute' : 'minutes'}`;
}
