// The one date formatter: every date and time Kinloop shows, on pages,
// charts, reports and e-mails, is worded here in the clinic's locale
// (src/lib/time/locale.ts). Local dates ('YYYY-MM-DD') are calendar days
// already and are formatted in UTC so no zone can move them to another day;
// instants are shown in the time zone given (the client's, for their records).
import { addDays, daysFrom, isLocalDate, localDate, utcDateOf } from './local-date';

/** The locale of a clinic that has none and whose time zone names no country (src/lib/time/locale.ts). */
export const FALLBACK_LOCALE = 'en-GB';

/**
 * - `day`: "Mon 23 Nov 2026" — lists and tables
 * - `dayLong`: "Monday 23 November 2026" — a date said on its own
 * - `date`: "23 November 2026"
 * - `dateShort`: "23 Nov 2026" — dense tables
 * - `dayMonth`: "23 Nov" — chart axes
 * - `dayMonthLong`: "23 November"
 * - `weekdayDayMonth`: "Monday 23 November" — the rider's pages, within the year
 * - `weekday`: "Monday"
 * (the order and punctuation follow the locale).
 */
export type DateStyle = 'day' | 'dayLong' | 'date' | 'dateShort' | 'dayMonth' | 'dayMonthLong' | 'weekdayDayMonth' | 'weekday' | 'monthYear';

const STYLES: Record<DateStyle, Intl.DateTimeFormatOptions> = {
  day: { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric' },
  dayLong: { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric' },
  date: { day: 'numeric', month: 'long', year: 'numeric' },
  dateShort: { day: 'numeric', month: 'short', year: 'numeric' },
  dayMonth: { day: 'numeric', month: 'short' },
  dayMonthLong: { day: 'numeric', month: 'long' },
  weekdayDayMonth: { weekday: 'long', day: 'numeric', month: 'long' },
  weekday: { weekday: 'long' },
  monthYear: { month: 'long', year: 'numeric' },
};

// Hours as the locale writes them ("09:05" and "14:05" in en-GB, "2:05 PM" in en-US).
const TIME: Intl.DateTimeFormatOptions = { timeStyle: 'short' };

const cache = new Map<string, Intl.DateTimeFormat>();

function formatter(locale: string, options: Intl.DateTimeFormatOptions, timeZone: string): Intl.DateTimeFormat {
  const key = `${locale}|${timeZone}|${JSON.stringify(options)}`;
  let f = cache.get(key);
  if (!f) {
    f = new Intl.DateTimeFormat(locale, { ...options, timeZone });
    cache.set(key, f);
  }
  return f;
}

/** A local date ('YYYY-MM-DD'). */
export function formatDate(date: string, locale: string, style: DateStyle = 'day'): string {
  return formatter(locale, STYLES[style], 'UTC').format(utcDateOf(date));
}

/** The calendar date of an instant in `timeZone`. */
export function formatInstantDate(instant: string | Date, locale: string, timeZone: string, style: DateStyle = 'day'): string {
  return formatDate(localDate(instant, timeZone), locale, style);
}

/** The clock time of an instant in `timeZone`: "14:05". */
export function formatTime(instant: string | Date, locale: string, timeZone: string): string {
  return formatter(locale, TIME, timeZone).format(new Date(instant));
}

/** Date and time of an instant in `timeZone`: "Mon 23 Nov 2026, 14:05" (the date as formatDate words it, then the time). */
export function formatDateTime(instant: string | Date, locale: string, timeZone: string, style: DateStyle = 'day'): string {
  return `${formatInstantDate(instant, locale, timeZone, style)}, ${formatTime(instant, locale, timeZone)}`;
}

/**
 * A week, written as the date it starts: "the week of 23 November" (with the
 * year when asked, for spans that may cross one). Takes the Monday or a week
 * key such as '2026-W48'.
 */
export function weekOf(mondayOrIsoWeek: string, locale: string, { year = false }: { year?: boolean } = {}): string {
  const monday = isLocalDate(mondayOrIsoWeek) ? mondayOrIsoWeek : mondayOfWeekKey(mondayOrIsoWeek);
  return `the week of ${formatDate(monday, locale, year ? 'date' : 'dayMonthLong')}`;
}

// A week key's Monday without importing the week module into every island:
// 4 January is always in week 1 (ISO 8601).
function mondayOfWeekKey(key: string): string {
  const m = /^(\d{4})-W(\d{2})$/.exec(key);
  if (!m) throw new RangeError(`Not an ISO week (YYYY-Www): ${key}`);
  const jan4 = `${m[1]}-01-04`;
  const weekday = ((utcDateOf(jan4).getUTCDay() + 6) % 7) + 1;
  return addDays(jan4, 1 - weekday + (Number(m[2]) - 1) * 7);
}

/** "today", "tomorrow", the weekday within the coming week, else "Thursday 19 March". */
export function dayWords(date: string, today: string, locale: string): string {
  const ahead = daysFrom(today, date);
  if (ahead === 0) return 'today';
  if (ahead === 1) return 'tomorrow';
  if (ahead > 1 && ahead < 7) return formatDate(date, locale, 'weekday');
  return formatDate(date, locale, 'weekdayDayMonth');
}

/** Calendar days from the instant to `now`, both taken in `timeZone`; never negative. */
export function daysAgo(instant: string | Date, now: Date, timeZone: string): number {
  return Math.max(0, daysFrom(localDate(instant, timeZone), localDate(now, timeZone)));
}

function spanWords(days: number): string {
  if (days < 14) return `${days} ${days === 1 ? 'day' : 'days'}`;
  if (days < 60) return `${Math.floor(days / 7)} weeks`;
  // From two months on, so that an older date never reads as a shorter span than "8 weeks".
  return `${Math.max(2, Math.floor(days / 30.44))} months`;
}

/** "today", "yesterday", "3 days ago", "5 weeks ago", "4 months ago". */
export function relativeDay(instant: string | Date, now: Date, timeZone: string): string {
  const days = daysAgo(instant, now, timeZone);
  if (days === 0) return 'today';
  if (days === 1) return 'yesterday';
  return `${spanWords(days)} ago`;
}

/** "Raised today", "Open for 1 day", "Open for 3 weeks". */
export function openFor(raisedAt: string, now: Date, timeZone: string): string {
  const days = daysAgo(raisedAt, now, timeZone);
  return days === 0 ? 'Raised today' : `Open for ${spanWords(days)}`;
}
