// Calendar wording for the rider and carer pages. Local dates ('YYYY-MM-DD')
// are formatted at noon UTC so that no time zone can move them to another day.

const noon = (date: string) => new Date(`${date}T12:00:00Z`);
const DAY_MS = 86_400_000;

/** The calendar date of an instant in a time zone. */
export function localDate(instant: Date | string, timeZone: string): string {
  const parts = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).formatToParts(new Date(instant));
  const part = (type: string) => parts.find((p) => p.type === type)?.value ?? '';
  return `${part('year')}-${part('month')}-${part('day')}`;
}

/** Whole days from `from` to `to` (negative when `to` is earlier). */
export function daysBetween(from: string, to: string): number {
  return Math.round((noon(to).getTime() - noon(from).getTime()) / DAY_MS);
}

/** "Thursday 12 March". */
export function dayMonth(date: string, locale: string): string {
  return new Intl.DateTimeFormat(locale, { weekday: 'long', day: 'numeric', month: 'long', timeZone: 'UTC' }).format(noon(date));
}

/** "12 March 2026". */
export function fullDate(date: string, locale: string): string {
  return new Intl.DateTimeFormat(locale, { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' }).format(noon(date));
}

/** "12 Mar", for chart axes. */
export function shortDate(date: string, locale: string): string {
  return new Intl.DateTimeFormat(locale, { day: 'numeric', month: 'short', timeZone: 'UTC' }).format(noon(date));
}

/** "today", "tomorrow", "Thursday" within the coming week, else "Thursday 19 March". */
export function dayWords(date: string, today: string, locale: string): string {
  const ahead = daysBetween(today, date);
  if (ahead === 0) return 'today';
  if (ahead === 1) return 'tomorrow';
  if (ahead > 1 && ahead < 7) return new Intl.DateTimeFormat(locale, { weekday: 'long', timeZone: 'UTC' }).format(noon(date));
  return dayMonth(date, locale);
}

/** "Tuesday 3 March" of an instant, in the client's time zone. */
export function instantDay(iso: string, locale: string, timeZone: string): string {
  return new Intl.DateTimeFormat(locale, { weekday: 'long', day: 'numeric', month: 'long', timeZone }).format(new Date(iso));
}

/** "Tuesday 3 March, 14:20" of an instant, in the given time zone. */
export function instantDayTime(iso: string, locale: string, timeZone?: string): string {
  return new Intl.DateTimeFormat(locale, { weekday: 'long', day: 'numeric', month: 'long', hour: '2-digit', minute: '2-digit', timeZone }).format(new Date(iso));
}
