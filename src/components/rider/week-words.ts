// The sentences that sum up a client's week, shared by the rider's home and
// the carer's home so both say the same thing.
import { dayWords, formatDate } from '../../lib/time/format';
import type { WeekData } from './types';

const sessions = (n: number) => `${n} ${n === 1 ? 'session' : 'sessions'}`;

/** "2 of 3 sessions done this week". */
export function weekHeadline(week: Pick<WeekData, 'prescribed' | 'counted'>): string {
  const { prescribed, counted } = week;
  if (!prescribed) return counted ? `${sessions(counted)} done this week` : 'No sessions yet this week';
  if (counted > prescribed) return `${sessions(counted)} done this week, ${counted - prescribed} more than the ${prescribed} set`;
  return `${counted} of ${sessions(prescribed)} done this week`;
}

/** Sessions this week that were too short to count towards it, or null when there were none. */
export function shortNote(week: Pick<WeekData, 'short'>): string | null {
  if (!week.short) return null;
  return week.short === 1
    ? '1 more session this week was shorter than the set time, so it is not counted.'
    : `${week.short} more sessions this week were shorter than the set time, so they are not counted.`;
}

export type DueTone = 'done' | 'due' | 'paused' | 'none';

/** When the next session is due, as a headline and an optional second line. */
export function nextDueWords(week: Pick<WeekData, 'nextDue'>, today: string, locale: string): { tone: DueTone; headline: string; detail: string | null } {
  const { date, reason } = week.nextDue;
  const when = date ? dayWords(date, today, locale) : null;
  switch (reason) {
    case 'no_target':
      return { tone: 'none', headline: 'No sessions are set yet', detail: 'The number of sessions a week comes from the prescription, which the therapist sets.' };
    case 'paused':
      return {
        tone: 'paused',
        headline: date ? `Program paused until ${formatDate(date, locale, 'weekdayDayMonth')}` : 'Program paused for now',
        detail: date ? 'No sessions are due during the pause, and it does not break the streak.' : 'The clinic will say when sessions start again. A pause does not break the streak.',
      };
    case 'week_met':
      return { tone: 'done', headline: 'This week’s sessions are done — well done', detail: when ? `Next session: ${when}` : null };
    case 'due_today':
      return { tone: 'due', headline: 'Next session: today', detail: null };
    case 'due':
      return { tone: 'due', headline: when ? `Next session: ${when}` : 'Next session: not planned yet', detail: null };
  }
}

/** "A 4-week streak" or the encouragement to start one. */
export function streakWords(weeks: number): { headline: string; detail: string } {
  if (weeks <= 0) return { headline: 'No streak yet', detail: 'A streak starts with the first week in which all the set sessions are done.' };
  return {
    headline: `${weeks}-week streak`,
    detail: weeks === 1 ? 'One week with all the set sessions done.' : `${weeks} weeks in a row with all the set sessions done.`,
  };
}
