import { describe, it, expect } from 'vitest';
import { daysAgo, localDateAfter, longDate, openFor, relativeDay } from '../../../src/components/triage/relative-time';
import { inZone } from './time-zone';

const DAY_MS = 86_400_000;
const NOW = new Date('2026-10-14T15:00:00Z');
/** An instant `days` whole days before NOW, for spans where the time zone plays no part (runs in UTC). */
const before = (days: number) => new Date(NOW.getTime() - days * DAY_MS).toISOString();

describe('daysAgo', () => {
  it('counts calendar days, not 24-hour periods', () => {
    inZone('UTC', () => {
      expect(daysAgo('2026-10-14T00:01:00Z', NOW)).toBe(0);
      expect(daysAgo('2026-10-13T23:59:00Z', new Date('2026-10-14T00:01:00Z'))).toBe(1);
      expect(daysAgo('2026-10-04T15:00:00Z', NOW)).toBe(10);
    });
  });

  it('is never negative for an instant after now', () => {
    expect(daysAgo('2026-10-20T09:00:00Z', NOW)).toBe(0);
  });

  it('uses the calendar of the runtime time zone', () => {
    // 28 March 23:30 UTC and 29 March 00:30 UTC are one day apart in UTC, and
    // both on 29 March in Auckland.
    // source: IANA tz database: Pacific/Auckland is on NZDT (UTC+13) until 2026-04-05
    const then = '2026-03-28T23:30:00Z';
    const now = new Date('2026-03-29T00:30:00Z');
    expect(inZone('UTC', () => daysAgo(then, now))).toBe(1);
    expect(inZone('Pacific/Auckland', () => daysAgo(then, now))).toBe(0);
  });

  it('counts the 25-hour day BST ends as one day', () => {
    // source: IANA tz database: Europe/London BST ends 2026-10-25 at 01:00 UTC,
    // so 2026-10-24T23:30Z is 00:30 BST and 2026-10-25T23:30Z is 23:30 GMT, both on 25 October
    inZone('Europe/London', () => {
      expect(daysAgo('2026-10-24T23:30:00Z', new Date('2026-10-25T23:30:00Z'))).toBe(0);
      expect(daysAgo('2026-10-24T22:30:00Z', new Date('2026-10-25T23:30:00Z'))).toBe(1);
    });
  });

  it('counts the 23-hour day BST starts as one day', () => {
    // source: IANA tz database: Europe/London BST starts 2026-03-29 at 01:00 UTC
    inZone('Europe/London', () => {
      expect(daysAgo('2026-03-28T12:00:00Z', new Date('2026-03-30T11:30:00Z'))).toBe(2);
      expect(daysAgo('2026-03-28T23:30:00Z', new Date('2026-03-29T22:59:00Z'))).toBe(1);
    });
  });

  it('counts the day DST ends in New York as one day', () => {
    // source: IANA tz database: America/New_York EDT ends 2026-11-01 at 06:00 UTC;
    // 2026-10-31T04:30Z is 31 Oct 00:30 EDT, 2026-11-02T04:30Z is 1 Nov 23:30 EST
    inZone('America/New_York', () => {
      expect(daysAgo('2026-10-31T04:30:00Z', new Date('2026-11-02T04:30:00Z'))).toBe(1);
    });
  });
});

describe('relativeDay', () => {
  it.each([
    [0, 'today'],
    [1, 'yesterday'],
    [2, '2 days ago'],
    [13, '13 days ago'],
    [14, '2 weeks ago'],
    [20, '2 weeks ago'],
    [21, '3 weeks ago'],
    [59, '8 weeks ago'],
    [61, '2 months ago'],
    [365, '11 months ago'],
    [400, '13 months ago'],
  ])('%i days back reads "%s"', (days, words) => {
    expect(inZone('UTC', () => relativeDay(before(days), NOW))).toBe(words);
  });

  it('never says "1 weeks"', () => {
    inZone('UTC', () => {
      for (let d = 0; d < 800; d++) expect(relativeDay(before(d), NOW)).not.toMatch(/\b1 (days|weeks|months)\b/);
    });
  });

  // spanWords switches from weeks to months at 60 days but floors the months:
  // 59 days reads "8 weeks ago", 60 days "1 month ago", 61 days "2 months ago".
  // Day 60 reads younger than the day before it. Rounding the months (or
  // starting months where floor(days / 30.44) is 2) keeps the wording growing.
  it('never reads a shorter span for an older date', () => {
    inZone('UTC', () => {
      expect(relativeDay(before(60), NOW)).not.toBe('1 month ago');
    });
  });
});

describe('openFor', () => {
  it.each([
    [0, 'Raised today'],
    [1, 'Open for 1 day'],
    [5, 'Open for 5 days'],
    [21, 'Open for 3 weeks'],
    [100, 'Open for 3 months'],
  ])('%i days after raising reads "%s"', (days, words) => {
    expect(inZone('UTC', () => openFor(before(days), NOW))).toBe(words);
  });

  it('counts a flag raised late yesterday as one day open', () => {
    expect(inZone('UTC', () => openFor('2026-10-13T23:50:00Z', new Date('2026-10-14T00:10:00Z')))).toBe('Open for 1 day');
  });
});

describe('longDate', () => {
  it('gives weekday, day, month and year in the locale', () => {
    // source: date-fns format('EEEE'): 2026-12-01 is a Tuesday
    const en = inZone('UTC', () => longDate('2026-12-01T12:00:00Z', 'en-GB'));
    expect(en).toContain('Tuesday');
    expect(en).toContain('1 December 2026');
    const de = inZone('UTC', () => longDate('2026-12-01T12:00:00Z', 'de-DE'));
    expect(de).toContain('Dienstag');
    expect(de).toContain('1. Dezember 2026');
  });

  it('shows an instant on its date in the runtime time zone', () => {
    // source: IANA tz database: Pacific/Auckland is on NZDT (UTC+13) in December
    expect(inZone('Pacific/Auckland', () => longDate('2026-12-01T23:30:00Z', 'en-GB'))).toContain('2 December 2026');
    expect(inZone('America/Los_Angeles', () => longDate('2026-12-01T05:00:00Z', 'en-GB'))).toContain('30 November 2026');
  });

  it('keeps a local date at local noon on that date in the zones furthest from UTC', () => {
    // FlagActionDialog passes `${until}T12:00:00` (local time, no offset).
    // source: IANA tz database: Pacific/Kiritimati is UTC+14, Pacific/Pago_Pago UTC−11
    for (const zone of ['Pacific/Kiritimati', 'Pacific/Pago_Pago', 'UTC']) {
      expect(inZone(zone, () => longDate('2026-12-01T12:00:00', 'en-GB'))).toContain('1 December 2026');
    }
  });
});

describe('localDateAfter', () => {
  it('gives a zero-padded YYYY-MM-DD', () => {
    expect(inZone('UTC', () => localDateAfter(new Date('2026-03-02T10:00:00Z'), 0))).toBe('2026-03-02');
    expect(inZone('UTC', () => localDateAfter(new Date('2026-03-02T10:00:00Z'), 7))).toBe('2026-03-09');
  });

  it('rolls over months and years, forwards and back', () => {
    inZone('UTC', () => {
      expect(localDateAfter(new Date('2026-12-31T10:00:00Z'), 1)).toBe('2027-01-01');
      expect(localDateAfter(new Date('2026-01-01T10:00:00Z'), -1)).toBe('2025-12-31');
      expect(localDateAfter(new Date('2026-01-31T10:00:00Z'), 30)).toBe('2026-03-02');
    });
  });

  it('knows leap days', () => {
    // source: Gregorian calendar rule (divisible by 4, not by 100 unless by 400): 2028 is a leap year, 2026 is not
    inZone('UTC', () => {
      expect(localDateAfter(new Date('2028-02-28T10:00:00Z'), 1)).toBe('2028-02-29');
      expect(localDateAfter(new Date('2026-02-28T10:00:00Z'), 1)).toBe('2026-03-01');
    });
  });

  it('starts from the local date of now, not the UTC date', () => {
    const now = new Date('2026-03-28T23:30:00Z');
    expect(inZone('Europe/London', () => localDateAfter(now, 1))).toBe('2026-03-29');
    // source: IANA tz database: Pacific/Auckland is on NZDT (UTC+13) on 2026-03-29
    expect(inZone('Pacific/Auckland', () => localDateAfter(now, 1))).toBe('2026-03-30');
    // source: IANA tz database: America/Los_Angeles is on PDT (UTC−7) in March 2026
    expect(inZone('America/Los_Angeles', () => localDateAfter(now, 1))).toBe('2026-03-29');
  });

  it('counts across both DST changes of the year in whole days', () => {
    // source: IANA tz database: Europe/London BST from 2026-03-29 to 2026-10-25
    inZone('Europe/London', () => {
      expect(localDateAfter(new Date('2026-03-28T12:00:00Z'), 7)).toBe('2026-04-04');
      expect(localDateAfter(new Date('2026-10-24T23:30:00Z'), 0)).toBe('2026-10-25');
      expect(localDateAfter(new Date('2026-10-24T23:30:00Z'), 1)).toBe('2026-10-26');
    });
  });

  it('gives a date whose local midnight does not exist', () => {
    // source: IANA tz database 2025b, rule Chile "2023 max S Su>=2 4u 1": America/Santiago
    // moves from 00:00 to 01:00 on 2026-09-06, so that day has no midnight
    inZone('America/Santiago', () => {
      const now = new Date('2026-09-05T15:00:00Z');
      expect(localDateAfter(now, 1)).toBe('2026-09-06');
      expect(localDateAfter(now, 2)).toBe('2026-09-07');
    });
  });
});
