// Per ISO week (in the client's time zone) from the program's first week to
// the current one, for the progress charts. Weeks without rides are kept, as
// zeros, so a chart shows the gap. Mean power is weighted by active time, as
// the per-ride means are (PRODUCT.md "Canonical ride metrics").
import { isoWeekKey } from '../time/iso-week';
import { addDays, localDate, mondayOf } from '../time/local-date';
import type { RiderSession } from './types';

type WeekInput = Pick<RiderSession, 'startedAt' | 'activeS' | 'meanPowerW' | 'distanceM'>;

export interface WeekProgress {
  isoWeek: string;
  monday: string;
  sessions: number;
  activeMinutes: number;
  distanceM: number;
  /** null when no ride of the week has a mean power. */
  meanPowerW: number | null;
}

/** `programStart` is the program's first local date, 'YYYY-MM-DD'. Rides outside the program's weeks are left out. */
export function weeklyProgress(
  sessions: WeekInput[],
  timeZone: string,
  programStart: string,
  now: Date | string,
): WeekProgress[] {
  const firstMonday = mondayOf(programStart);
  const lastMonday = mondayOf(localDate(now, timeZone));
  const weeks = new Map<string, WeekProgress & { powerWeight: number; powerSum: number }>();
  for (let m = firstMonday; m <= lastMonday; m = addDays(m, 7)) {
    weeks.set(m, { isoWeek: isoWeekKey(m), monday: m, sessions: 0, activeMinutes: 0, distanceM: 0, meanPowerW: null, powerWeight: 0, powerSum: 0 });
  }
  for (const s of sessions) {
    if (s.startedAt === null) continue;
    const week = weeks.get(mondayOf(localDate(s.startedAt, timeZone)));
    if (!week) continue;
    week.sessions += 1;
    week.activeMinutes += s.activeS / 60;
    week.distanceM += s.distanceM ?? 0;
    if (s.meanPowerW !== null && s.activeS > 0) {
      week.powerSum += s.meanPowerW * s.activeS;
      week.powerWeight += s.activeS;
    }
  }
  return [...weeks.values()].map(({ powerWeight, powerSum, ...w }) => ({
    ...w,
    meanPowerW: powerWeight > 0 ? powerSum / powerWeight : null,
  }));
}
