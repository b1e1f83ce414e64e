// Calendar help for the demo story: local dates in a client's time zone,
// counted the way seed.ts counts the program start. Day arithmetic and wall
// times come from src/lib/time like everywhere else.
import { isoWeekOf } from '../time/iso-week';
import { addDays, isoWeekday, localDate } from '../time/local-date';

/** The local date `days` before `now` in `timeZone`, as seed.ts sets a client's program start. */
export function daysBefore(now: Date, timeZone: string, days: number): string {
  return addDays(localDate(now, timeZone), -days);
}

/** Local dates from `from` to `to` (inclusive) that fall on the ISO weekdays given (1 = Monday … 7 = Sunday). */
export function datesOnWeekdays(from: string, to: string, weekdays: readonly number[]): string[] {
  const out: string[] = [];
  for (let day = from; day <= to; day = addDays(day, 1)) {
    if (weekdays.includes(isoWeekday(day))) out.push(day);
  }
  return out;
}

/** Monday of the ISO week `weeksBack` weeks before the one holding `now` in `timeZone`. */
export function mondayWeeksBack(now: Date, timeZone: string, weeksBack: number): string {
  return addDays(isoWeekOf(localDate(now, timeZone), timeZone).monday, -7 * weeksBack);
}
