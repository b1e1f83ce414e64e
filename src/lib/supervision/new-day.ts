// Which clients the hourly flag sweep judges: those for whom a new local day
// has begun since the sweep before (a finished day: no session for too long;
// on Mondays a finished week). Comparing local dates an hour apart, rather
// than asking for local hour 0, also works where midnight does not exist on a
// clock-change day (the day starts at 01:00) or happens twice.
import { localDate } from '../time/local-date';

/** The sweep runs every hour (flag-jobs.ts). */
export const SWEEP_EVERY_MS = 3_600_000;

export function newDaySinceLastSweep(timeZone: string, now: Date): boolean {
  return localDate(now, timeZone) !== localDate(new Date(now.getTime() - SWEEP_EVERY_MS), timeZone);
}

export function clientsWithNewDay<C extends { time_zone: string }>(clients: C[], now: Date): C[] {
  return clients.filter((c) => newDaySinceLastSweep(c.time_zone, now));
}
