// The one number formatter: every figure Kinloop shows or writes in a flag or
// e-mail is rounded by roundTo (half away from zero) to the digits its kind
// has here, then written in the clinic's locale. One rounding and one word per
// thing, so a baseline never reads 14.3 W in one place and 14.2 W in another.
// Missing values read "—".
import { roundTo } from '../analytics/round';

const DASH = '—';
// A signed change is written with a true minus sign, never a hyphen.
const MINUS = '\u2212';

/** Decimal places per kind of figure. */
export const DIGITS = {
  powerW: 1,
  powerTrendWPerWeek: 1,
  currentPerWattMaPerW: 2,
  currentMa: 1,
  cadenceRpm: 0,
  percent: 0,
  distanceKm: 1,
} as const;

const cache = new Map<string, Intl.NumberFormat>();
function formatter(locale: string | undefined, digits: number): Intl.NumberFormat {
  const key = `${locale ?? ''}|${digits}`;
  let f = cache.get(key);
  if (!f) {
    f = new Intl.NumberFormat(locale, { minimumFractionDigits: digits, maximumFractionDigits: digits });
    cache.set(key, f);
  }
  return f;
}

const missing = (value: number | null | undefined): value is null | undefined => value === null || value === undefined || !Number.isFinite(value);

export function number(value: number | null | undefined, digits: number, locale?: string): string {
  if (missing(value)) return DASH;
  // Rounded first, so a value that rounds to zero is written without a minus sign.
  return formatter(locale, digits).format(roundTo(value, digits));
}

export function withUnit(value: number | null | undefined, digits: number, unit: string, locale?: string): string {
  const text = number(value, digits, locale);
  return text === DASH ? DASH : `${text} ${unit}`;
}

/** "+0.2", "−0.2", "0.0": a change, signed once it is not zero at these digits. */
export function signed(value: number | null | undefined, digits: number, locale?: string): string {
  if (missing(value)) return DASH;
  const r = roundTo(value, digits);
  const text = formatter(locale, digits).format(Math.abs(r));
  return r > 0 ? `+${text}` : r < 0 ? `${MINUS}${text}` : text;
}

export const watts = (value: number | null | undefined, locale?: string) => withUnit(value, DIGITS.powerW, 'W', locale);

/** "−0.2 W a week". */
export function wattsPerWeek(value: number | null | undefined, locale?: string): string {
  const text = signed(value, DIGITS.powerTrendWPerWeek, locale);
  return text === DASH ? DASH : `${text} W a week`;
}

export const milliampsPerWatt = (value: number | null | undefined, locale?: string) => withUnit(value, DIGITS.currentPerWattMaPerW, 'mA/W', locale);

/** "42 %" of a share or of the size of a change (the sign is said in words). */
export const percent = (value: number | null | undefined, locale?: string) => withUnit(missing(value) ? value : Math.abs(value), DIGITS.percent, '%', locale);

export function count(n: number, singular: string, plural = `${singular}s`): string {
  return `${n} ${n === 1 ? singular : plural}`;
}

/** Minutes of a phase or session, with one decimal unless whole: 23.9 minutes must not read as 24 when 24 is where a session starts to count. */
export function minutes(seconds: number | null | undefined, locale?: string): string {
  if (missing(seconds)) return DASH;
  const m = roundTo(seconds / 60, 1);
  return `${number(m, Number.isInteger(m) ? 0 : 1, locale)} min`;
}

/** "45 s", "32 min", "1 h 05 min". */
export function duration(seconds: number | null | undefined): string {
  if (missing(seconds)) return DASH;
  if (Math.round(seconds) < 60) return `${Math.round(seconds)} s`;
  const total = Math.round(seconds / 60);
  if (total < 60) return `${total} min`;
  return `${Math.floor(total / 60)} h ${String(total % 60).padStart(2, '0')} min`;
}

/** Whole metres below a kilometre, else kilometres with one decimal. */
export function distance(metres: number | null | undefined, locale?: string): string {
  if (missing(metres)) return DASH;
  return Math.round(metres) < 1000 ? withUnit(metres, 0, 'm', locale) : withUnit(metres / 1000, DIGITS.distanceKm, 'km', locale);
}

/** "m:ss" from seconds, for chart positions. */
export function clock(seconds: number): string {
  const s = Math.max(0, Math.round(seconds));
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`;
}
