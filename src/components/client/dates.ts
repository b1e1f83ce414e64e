// Date wording for the client page. Local dates ('YYYY-MM-DD') are calendar
// days already, so they are formatted in UTC to stay on the same day;
// instants are shown in the client's time zone.

function utcDate(localDate: string): Date {
  return new Date(`${localDate}T00:00:00Z`);
}

/** "Mon 5 Oct 2026" (in the locale's order). */
export function dayLabel(localDate: string, locale: string): string {
  return new Intl.DateTimeFormat(locale, { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' }).format(utcDate(localDate));
}

/** "5 Oct", for chart axes. */
export function shortDay(instant: string, locale: string, timeZone: string): string {
  return new Intl.DateTimeFormat(locale, { day: 'numeric', month: 'short', timeZone }).format(new Date(instant));
}

/** "5 Oct 2026, 16:30". */
export function instantLabel(instant: string, locale: string, timeZone: string): string {
  return new Intl.DateTimeFormat(locale, { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', timeZone }).format(new Date(instant));
}

export function addDays(localDate: string, days: number): string {
  const d = utcDate(localDate);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/** The Monday of an ISO week key such as '2026-W41' (4 January is always in week 1). */
export function mondayOfIsoWeek(isoWeek: string): string {
  const [year, week] = isoWeek.split('-W').map(Number);
  const jan4 = utcDate(`${year}-01-04`);
  const weekday = jan4.getUTCDay() || 7;
  return addDays(jan4.toISOString().slice(0, 10), 1 - weekday + (week - 1) * 7);
}

/** "5 Oct" of a local date. */
export function dayMonth(localDate: string, locale: string): string {
  return new Intl.DateTimeFormat(locale, { day: 'numeric', month: 'short', timeZone: 'UTC' }).format(utcDate(localDate));
}

/** "Mon 30 Nov 2026" of an instant in the client's zone. */
export function startDay(instant: string, locale: string, timeZone: string): string {
  return new Intl.DateTimeFormat(locale, { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric', timeZone }).format(new Date(instant));
}

/** "10:15" of an instant in the client's zone. */
export function startTime(instant: string, locale: string, timeZone: string): string {
  return new Intl.DateTimeFormat(locale, { hour: '2-digit', minute: '2-digit', timeZone }).format(new Date(instant));
}
