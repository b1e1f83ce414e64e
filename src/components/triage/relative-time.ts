// How long ago something happened, in the viewer's calendar days. The caller
// passes `now`, so the wording is the same wherever it is computed.

const DAY_MS = 86_400_000;

/** Calendar days from `iso` to `now` in the runtime's time zone; never negative. */
export function daysAgo(iso: string, now: Date): number {
  const then = new Date(iso);
  const a = Date.UTC(then.getFullYear(), then.getMonth(), then.getDate());
  const b = Date.UTC(now.getFullYear(), now.getMonth(), now.getDate());
  return Math.max(0, Math.round((b - a) / DAY_MS));
}

function spanWords(days: number): string {
  if (days < 14) return `${days} ${days === 1 ? 'day' : 'days'}`;
  if (days < 60) return `${Math.floor(days / 7)} weeks`;
  // From two months on, so that an older date never reads as a shorter span than "8 weeks".
  const months = Math.max(2, Math.floor(days / 30.44));
  return `${months} ${months === 1 ? 'month' : 'months'}`;
}

/** "today", "yesterday", "3 days ago", "5 weeks ago", "4 months ago". */
export function relativeDay(iso: string, now: Date): string {
  const days = daysAgo(iso, now);
  if (days === 0) return 'today';
  if (days === 1) return 'yesterday';
  return `${spanWords(days)} ago`;
}

/** "Raised today", "Open for 1 day", "Open for 3 weeks". */
export function openFor(raisedAt: string, now: Date): string {
  const days = daysAgo(raisedAt, now);
  return days === 0 ? 'Raised today' : `Open for ${spanWords(days)}`;
}

/** "Tuesday 1 December 2026" in the viewer's language. */
export function longDate(iso: string, locale?: string): string {
  return new Date(iso).toLocaleDateString(locale, { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric' });
}

/** A local calendar date `days` after `now`, as a date input wants it (YYYY-MM-DD). */
export function localDateAfter(now: Date, days: number): string {
  const d = new Date(now.getFullYear(), now.getMonth(), now.getDate() + days);
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
}
