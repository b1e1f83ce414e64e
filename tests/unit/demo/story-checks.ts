// Helpers for the demo story tests: local calendar facts worked out with
// date-fns and @date-fns/tz (an independent reference for the story's luxon
// arithmetic), and the session flags a plan leaves.
import { TZDate } from '@date-fns/tz';
import { format, getISOWeek, getISOWeekYear, subDays } from 'date-fns';
import type { DemoPause, DemoPrescription } from '../../../src/lib/demo/ride-story';
import { applyFlagChanges, planFlagChanges, type ExistingFlag, type FlagSession } from '../../../src/lib/flags';

/**
 * Each story client's flags as "kind:severity", with ":cleared" for a flag
 * whose condition held and no longer does, per the comment at the top of
 * ride-story.ts: the flags the planner leaves when the whole history arrives
 * at once, which are those that uploads week by week would have left.
 */
export const EXPECTED_FLAGS: Record<string, string[]> = {
  jonah: [],
  dev: ['power_drop:urgent'],
  mairi: ['missed_sessions:review:cleared'],
  hollis: ['power_drop:review'],
  annika: [],
  kofi: ['current_rise:review'],
  elsie: ['short_session:info'],
  rafael: [],
  wren: [],
  noor: ['missed_sessions:urgent'],
};

/**
 * Elsie rides on Mondays, Wednesdays and Fridays, and her latest two rides are
 * short (they do not count). Worked out by hand on the calendar: early in the
 * week one or both of them lie in the last finished week, which is then missed
 * as well — on these of the NOWS below, and on no other.
 */
export const ELSIE_WEEK_MISSED = new Set(['2026-11-16T07:00:00Z', '2026-11-17T19:00:00Z', '2027-01-04T10:00:00Z', '2027-04-05T11:00:00Z']);

export function expectedFlags(key: string, now: string): string[] {
  const extra = key === 'elsie' && ELSIE_WEEK_MISSED.has(now) ? ['missed_sessions:review'] : [];
  return [...EXPECTED_FLAGS[key], ...extra].sort();
}

/** Mondays to Sundays in London (GMT and BST), across a year end and a clock change. */
export const NOWS = [
  '2026-11-16T07:00:00Z',
  '2026-11-17T19:00:00Z',
  '2026-11-18T12:00:00Z',
  '2026-11-19T20:00:00Z',
  '2026-11-20T09:00:00Z',
  '2026-11-21T21:00:00Z',
  '2026-11-22T22:30:00Z',
  '2027-01-04T10:00:00Z',
  '2027-04-05T11:00:00Z',
];

export const localDay = (instant: string | number | Date, zone: string) => format(new TZDate(new Date(instant).getTime(), zone), 'yyyy-MM-dd');
export const localMinute = (instant: string, zone: string) => {
  const d = new TZDate(Date.parse(instant), zone);
  return d.getHours() * 60 + d.getMinutes();
};
export const isoWeekKey = (day: string) => {
  const d = new Date(`${day}T12:00:00Z`);
  return `${getISOWeekYear(d)}-W${String(getISOWeek(d)).padStart(2, '0')}`;
};
export const isoWeekday = (day: string) => ((new Date(`${day}T12:00:00Z`).getUTCDay() + 6) % 7) + 1;
export const plusDays = (day: string, days: number) => new Date(Date.parse(`${day}T12:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
/** The program start as seed.ts sets it: `days` before now on the client's calendar. */
export const daysAgo = (now: Date, zone: string, days: number) => format(subDays(new TZDate(now.getTime(), zone), days), 'yyyy-MM-dd');

/** The flags the planner leaves for a history that arrives all at once, with no flags before. */
export function flagsOf(
  timeZone: string,
  now: Date,
  prescriptions: DemoPrescription[],
  pauses: DemoPause[],
  sessions: FlagSession[],
): ExistingFlag[] {
  const input = { timeZone, now: now.toISOString(), prescriptions, pauses, sessions };
  let id = 0;
  return applyFlagChanges([], planFlagChanges([], input), input.now, () => `flag-${++id}`);
}

export const labels = (flags: ExistingFlag[]) => flags.map((f) => `${f.kind}:${f.severity}${f.clearedAt ? ':cleared' : ''}`).sort();
