import { localDate } from '../time/iso-week';

/** Today's date in a time zone, YYYY-MM-DD. */
export function clientToday(timeZone: string, now = new Date()): string {
  return localDate(now, timeZone);
}
