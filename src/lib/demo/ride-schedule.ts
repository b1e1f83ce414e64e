// Calendar help for the demo story: local dates in a client's time zone,
// counted the way seed.ts counts the program start, and wall times written
// with the UTC offset in force on that day.
import { DateTime } from 'luxon';
import { isoWeekOf, localDate } from '../time/iso-week';
import { addDays, parseLocalDate } from '../time/local-date';

/** The local date `days` before `now` in `timeZone`, as seed.ts sets a client's program start. */
export function daysBefore(now: Date, timeZone: string, days: number): string {
  return DateTime.fromJSDate(now).setZone(timeZone).minus({ days }).toISODate()!;
}

/** Local dates from `from` to `to` (inclusive) that fall on the ISO weekdays given (1 = Monday … 7 = Sunday). */
export function datesOnWeekdays(from: string, to: string, weekdays: readonly number[]): string[] {
  const out: string[] = [];
  for (let day = from; day <= to; day = addDays(day, 1)) {
    if (weekdays.includes(parseLocalDate(day).weekday)) out.push(day);
  }
  return out;
}

/** "2026-05-03" at 570 minutes after midnight in Europe/London → "2026-05-03T09:30:00+01:00". */
export function wallTime(date: string, minuteOfDay: number, timeZone: string): string {
  const d = parseLocalDate(date);
  const dt = DateTime.fromObject(
    { year: d.year, month: d.month, day: d.day, hour: Math.floor(minuteOfDay / 60), minute: minuteOfDay % 60 },
    { zone: timeZone },
  );
  if (!dt.isValid) throw new RangeError(`No wall time ${minuteOfDay} min on ${date} in ${timeZone}`);
  return dt.toISO({ suppressMilliseconds: true })!;
}

/** Days from local date `from` to `to`. */
export function daysBetween(from: string, to: string): number {
  return Math.round(parseLocalDate(to).diff(parseLocalDate(from), 'days').days);
}

/** Monday of the ISO week `weeksBack` weeks before the one holding `now` in `timeZone`. */
export function mondayWeeksBack(now: Date, timeZone: string, weeksBack: number): string {
  return addDays(isoWeekOf(localDate(now, timeZone), timeZone).monday, -7 * weeksBack);
}
