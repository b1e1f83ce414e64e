// Local calendar dates ('YYYY-MM-DD') and the arithmetic on them, for the
// server, the islands and the scripts alike: the one place Kinloop counts
// days. A local date carries no time zone, so the arithmetic runs in UTC where
// every day has 24 hours and a daylight-saving change cannot move it.
//
// Plain UTC arithmetic and cached Intl formatters rather than luxon objects:
// the flag rules replay a client's whole program day by day and week by week,
// and a luxon DateTime per step made that take seconds for a year of history.
// It also keeps luxon out of the browser bundles.

const LOCAL_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const DAY_MS = 86_400_000;

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

/** Throws a RangeError naming the value unless it is a real calendar date 'YYYY-MM-DD'. */
export function assertLocalDate(date: string): void {
  checkedMs(date);
}

export function addDays(date: string, days: number): string {
  return dateOfMs(checkedMs(date) + days * DAY_MS);
}

/** The same day `months` later, or the month's last day when it is shorter (31 January + 1 month → 28 or 29 February). */
export function addMonths(date: string, months: number): string {
  const at = new Date(checkedMs(date));
  const day = at.getUTCDate();
  at.setUTCDate(1);
  at.setUTCMonth(at.getUTCMonth() + months);
  const lastDay = new Date(Date.UTC(at.getUTCFullYear(), at.getUTCMonth() + 1, 0)).getUTCDate();
  at.setUTCDate(Math.min(day, lastDay));
  return dateOfMs(at.getTime());
}

/** 1 for Monday … 7 for Sunday (ISO 8601). */
export function isoWeekday(date: string): number {
  return ((new Date(checkedMs(date)).getUTCDay() + 6) % 7) + 1;
}

/** The Monday of the ISO week holding `date`. */
export function mondayOf(date: string): string {
  return addDays(date, 1 - isoWeekday(date));
}

/** Whole days from `from` to `to` (negative when `to` is earlier). */
export function daysFrom(from: string, to: string): number {
  return Math.round((checkedMs(to) - checkedMs(from)) / DAY_MS);
}

/** A local date as a Date at 00:00 UTC, for formatters that are told `timeZone: 'UTC'`. */
export function utcDateOf(date: string): Date {
  return new Date(checkedMs(date));
}

const dayFormatters = new Map<string, Intl.DateTimeFormat>();

function dayFormatter(timeZone: string): Intl.DateTimeFormat {
  let f = dayFormatters.get(timeZone);
  if (!f) {
    try {
      f = new Intl.DateTimeFormat('en-US', { timeZone, year: 'numeric', month: 'numeric', day: 'numeric', calendar: 'gregory', numberingSystem: 'latn' });
    } catch {
      throw new RangeError(`Not a valid time zone: ${timeZone}`);
    }
    dayFormatters.set(timeZone, f);
  }
  return f;
}

// An instant must say where it is: an ISO string without an offset would be
// read in the runtime's own zone, which differs between server and browser.
const INSTANT = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}(:?\d{2})?)$/i;

/** The epoch milliseconds of a Date or an ISO 8601 instant with `Z` or an offset. */
export function instantMs(instant: string | Date): number {
  const ms = instant instanceof Date ? instant.getTime() : INSTANT.test(instant) ? Date.parse(instant) : NaN;
  if (Number.isNaN(ms)) throw new RangeError(`Not a valid instant (ISO 8601 with Z or an offset): ${String(instant)}`);
  return ms;
}

/** The local calendar date ('YYYY-MM-DD') of an instant in `timeZone`. */
export function localDate(instant: string | Date, timeZone: string): string {
  const ms = instantMs(instant);
  let year = '';
  let month = '';
  let day = '';
  for (const part of dayFormatter(timeZone).formatToParts(ms)) {
    if (part.type === 'year') year = part.value;
    else if (part.type === 'month') month = part.value;
    else if (part.type === 'day') day = part.value;
  }
  return `${year.padStart(4, '0')}-${month.padStart(2, '0')}-${day.padStart(2, '0')}`;
}
