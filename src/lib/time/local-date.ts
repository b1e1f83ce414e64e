// Calendar arithmetic on local dates ('YYYY-MM-DD'). A local date carries no
// time zone, so the arithmetic runs in UTC where every day has 24 hours.
import { DateTime } from 'luxon';

const LOCAL_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const DAY_MS = 86_400_000;

// Plain UTC arithmetic rather than luxon objects: the flag rules replay a
// client's whole program day by day and week by week, and a luxon DateTime per
// step made that take seconds for a year of history.
function utcMidnightMs(date: string): number {
  const m = LOCAL_DATE.exec(date);
  if (!m) return NaN;
  const [year, month, day] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const at = new Date(0);
  at.setUTCFullYear(year, month - 1, day);
  return at.getUTCFullYear() === year && at.getUTCMonth() === month - 1 && at.getUTCDate() === day ? at.getTime() : NaN;
}

function checkedMs(date: string): number {
  const ms = utcMidnightMs(date);
  if (Number.isNaN(ms)) throw new RangeError(`Not a local date (YYYY-MM-DD): ${date}`);
  return ms;
}

const dateOfMs = (ms: number) => new Date(ms).toISOString().slice(0, 10);

export function isLocalDate(value: string): boolean {
  return !Number.isNaN(utcMidnightMs(value));
}

export function parseLocalDate(date: string): DateTime {
  checkedMs(date);
  return DateTime.fromISO(date, { zone: 'utc' });
}

export function addDays(date: string, days: number): string {
  return dateOfMs(checkedMs(date) + days * DAY_MS);
}

/** 1 for Monday … 7 for Sunday (ISO 8601). */
export function isoWeekday(date: string): number {
  return ((new Date(checkedMs(date)).getUTCDay() + 6) % 7) + 1;
}

/** Whole days from `from` to `to` (negative when `to` is earlier). */
export function daysFrom(from: string, to: string): number {
  return Math.round((checkedMs(to) - checkedMs(from)) / DAY_MS);
}

/** The instant (ISO, UTC) at which `date` begins in `timeZone`. */
export function startOfLocalDay(date: string, timeZone: string): string {
  checkedMs(date);
  const start = DateTime.fromISO(date, { zone: timeZone }).startOf('day');
  if (!start.isValid) throw new RangeError(`Not a valid time zone: ${timeZone}`);
  return start.toUTC().toISO()!;
}
