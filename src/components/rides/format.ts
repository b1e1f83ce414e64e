// Plain-text renderings of session figures, shared by the upload page, the
// session page and the import-profile preview. Missing values read "—".
import { siteLabel } from '../../lib/checks/labels';

const DASH = '—';

export function number(value: number | null | undefined, digits: number, locale?: string): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return DASH;
  // A value that rounds to zero is written without a minus sign.
  return value.toLocaleString(locale, { minimumFractionDigits: digits, maximumFractionDigits: digits, signDisplay: 'negative' } as Intl.NumberFormatOptions);
}

export function withUnit(value: number | null | undefined, digits: number, unit: string, locale?: string): string {
  const text = number(value, digits, locale);
  return text === DASH ? DASH : `${text} ${unit}`;
}

/** Minutes of a phase: one decimal below ten minutes, where a half-minute still matters. */
export function minutes(seconds: number | null | undefined, locale?: string): string {
  if (seconds === null || seconds === undefined || !Number.isFinite(seconds)) return DASH;
  const m = seconds / 60;
  return `${number(m, m < 10 && m !== Math.round(m) ? 1 : 0, locale)} min`;
}

/** "45 s", "32 min", "1 h 05 min". */
export function duration(seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined || !Number.isFinite(seconds)) return DASH;
  if (Math.round(seconds) < 60) return `${Math.round(seconds)} s`;
  const total = Math.round(seconds / 60);
  if (total < 60) return `${total} min`;
  return `${Math.floor(total / 60)} h ${String(total % 60).padStart(2, '0')} min`;
}

/** Metres below a kilometre, else kilometres with two decimals. */
export function distance(metres: number | null | undefined, locale?: string): string {
  if (metres === null || metres === undefined || !Number.isFinite(metres)) return DASH;
  return Math.round(metres) < 1000 ? withUnit(metres, 0, 'm', locale) : withUnit(metres / 1000, 2, 'km', locale);
}

/** "m:ss" from seconds, for chart positions. */
export function clock(seconds: number): string {
  const s = Math.max(0, Math.round(seconds));
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`;
}

/** "quadriceps_left" → "Left quadriceps", "channel_3" → "Channel 3". */
export function channelLabel(name: string): string {
  const words = siteLabel(name);
  return words.charAt(0).toUpperCase() + words.slice(1);
}

export const PHASE_LABELS: Record<string, string> = { passive: 'Passive', active: 'Active', cooldown: 'Cool-down' };

/** Weekday, date and time of a session start, in the given locale and time zone. */
export function sessionDateTime(iso: string, locale?: string, timeZone?: string): string {
  return new Intl.DateTimeFormat(locale, {
    weekday: 'long',
    day: 'numeric',
    month: 'long',
    year: 'numeric',
    hour: '2-digit',
    minute: '2-digit',
    timeZone,
  }).format(new Date(iso));
}

/** The first language of an Accept-Language header that Intl knows, else British English. */
export function requestLocale(acceptLanguage: string | null): string {
  const first = acceptLanguage?.split(',')[0]?.split(';')[0]?.trim();
  if (!first || first === '*') return 'en-GB';
  try {
    return Intl.DateTimeFormat.supportedLocalesOf(first)[0] ?? 'en-GB';
  } catch {
    return 'en-GB';
  }
}
