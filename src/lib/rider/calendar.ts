// Local calendar dates ('YYYY-MM-DD') in a client's time zone, and day
// arithmetic on them. Dates are handled as plain calendar days (in UTC inside
// luxon) so that a daylight-saving change can never make a day 23 or 25 hours
// long in the arithmetic.
import { DateTime } from 'luxon';

/** An instant: a Date or an ISO 8601 string with an offset or Z. */
export type Instant = Date | string;

/** A program pause: local dates, both inclusive; an open-ended pause has `end: null`. */
export interface Pause {
  start: string;
  end: string | null;
}

export function inZone(instant: Instant, timeZone: string): DateTime {
  const base = typeof instant === 'string' ? DateTime.fromISO(instant, { setZone: true }) : DateTime.fromJSDate(instant);
  if (!base.isValid) throw new Error(`Not a valid instant: ${String(instant)}`);
  const local = base.setZone(timeZone);
  if (!local.isValid) throw new Error(`Unknown time zone: ${timeZone}`);
  return local;
}

export function localDateOf(instant: Instant, timeZone: string): string {
  return inZone(instant, timeZone).toISODate() as string;
}

function day(date: string): DateTime {
  const d = DateTime.fromISO(date, { zone: 'utc' });
  if (!d.isValid || date.length !== 10) throw new Error(`Not a local date (YYYY-MM-DD): ${date}`);
  return d;
}

export function addDays(date: string, days: number): string {
  return day(date).plus({ days }).toISODate() as string;
}

export function addMonths(date: string, months: number): string {
  return day(date).plus({ months }).toISODate() as string;
}

/** 1 = Monday … 7 = Sunday. */
export function isoWeekday(date: string): number {
  return day(date).weekday;
}

export function mondayOf(date: string): string {
  return addDays(date, 1 - isoWeekday(date));
}

/** ISO 8601 week label, e.g. "2026-W41" (Monday first; week 1 holds the first Thursday). */
export function isoWeekLabel(date: string): string {
  const d = day(date);
  return `${d.weekYear}-W${String(d.weekNumber).padStart(2, '0')}`;
}

export function isPaused(date: string, pauses: Pause[]): boolean {
  return pauses.some((p) => p.start <= date && (p.end === null || date <= p.end));
}

/** The first day on or after `date` outside every pause; null when an open-ended pause covers it. */
export function firstUnpausedOnOrAfter(date: string, pauses: Pause[]): string | null {
  let d = date;
  for (;;) {
    const covering = pauses.find((p) => p.start <= d && (p.end === null || d <= p.end));
    if (!covering) return d;
    if (covering.end === null) return null;
    d = addDays(covering.end, 1);
  }
}
