// Which locale a clinic's dates and numbers are written in: the clinic's own
// setting, else English as written in the country of its time zone (where the
// tz database names one and Intl knows that variant), else British English.
// The words stay English; only the order, month names' form and the clock
// (24-hour or am/pm) follow the locale.
import { getTimezone } from 'countries-and-timezones';
import { FALLBACK_LOCALE } from './format';

/** True for a BCP 47 tag this runtime can format dates in (not merely fall back from). */
export function isSupportedLocale(tag: string): boolean {
  try {
    return Intl.DateTimeFormat.supportedLocalesOf(tag).length === 1;
  } catch {
    return false;
  }
}

/** "en-IE" for Europe/Dublin, "en-CA" for America/Toronto; en-GB where the zone names no country. */
export function defaultLocaleFor(timeZone: string): string {
  const country = getTimezone(timeZone)?.countries[0];
  const tag = country ? `en-${country}` : null;
  return tag && isSupportedLocale(tag) ? tag : FALLBACK_LOCALE;
}

export function clinicLocale(clinic: { locale: string | null; time_zone: string }): string {
  return clinic.locale && isSupportedLocale(clinic.locale) ? clinic.locale : defaultLocaleFor(clinic.time_zone);
}
