// Calendar arithmetic on local dates ('YYYY-MM-DD'). A local date carries no
// time zone, so the arithmetic runs in UTC where every day has 24 hours.
import { DateTime } from 'luxon';

const LOCAL_DATE = /^\d{4}-\d{2}-\d{2}$/;

export function isLocalDate(value: string): boolean {
  return LOCAL_DATE.test(value) && DateTime.fromISO(value, { zone: 'utc' }).isValid;
}

export function parseLocalDate(date: string): DateTime {
  const parsed = LOCAL_DATE.test(date) ? DateTime.fromISO(date, { zone: 'utc' }) : null;
  if (!parsed || !parsed.isValid) throw new RangeError(`Not a local date (YYYY-MM-DD): ${date}`);
  return parsed;
}

export function addDays(date: string, days: number): string {
  return parseLocalDate(date).plus({ days }).toISODate()!;
}

/** The instant (ISO, UTC) at which `date` begins in `timeZone`. */
export function startOfLocalDay(date: string, timeZone: string): string {
  parseLocalDate(date);
  const start = DateTime.fromISO(date, { zone: timeZone }).startOf('day');
  if (!start.isValid) throw new RangeError(`Not a valid time zone: ${timeZone}`);
  return start.toUTC().toISO()!;
}
