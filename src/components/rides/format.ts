// The session figures' wording for the ride pages: the shared formatters of
// src/lib/format and src/lib/time, under the names these components use.
import { FALLBACK_LOCALE, formatDateTime } from '../../lib/time/format';

export { clock, distance, duration, minutes, number, withUnit } from '../../lib/format/numbers';
export { channelLabel, PHASE_LABELS } from '../../lib/format/words';

/** Weekday, date and time of a session start: "Monday 5 October 2026, 10:30". */
export function sessionDateTime(iso: string, locale = FALLBACK_LOCALE, timeZone = Intl.DateTimeFormat().resolvedOptions().timeZone): string {
  return formatDateTime(iso, locale, timeZone, 'dayLong');
}
