import { describe, expect, it } from 'vitest';
import { DateTime } from 'luxon';
import { dayWords, daysAgo, formatDate, formatDateTime, formatInstantDate, formatTime, openFor, relativeDay, weekOf } from '../../../src/lib/time/format';
import { parseIsoWeek } from '../../../src/lib/time/iso-week';
import { addDays, localDate } from '../../../src/lib/time/local-date';
import { inZone } from './runtime-zone';

describe('formatDate of a local date', () => {
  // from memory (CLDR en-GB): a comma after the weekday when the year follows.
  it('words each style', () => {
    // source: date-fns format('EEEE'): 2026-11-23 is a Monday
    expect(formatDate('2026-11-23', 'en-GB', 'day')).toBe('Mon, 23 Nov 2026');
    expect(formatDate('2026-11-23', 'en-GB', 'dayLong')).toBe('Monday, 23 November 2026');
    expect(formatDate('2026-11-23', 'en-GB', 'date')).toBe('23 November 2026');
    expect(formatDate('2026-11-23', 'en-GB', 'dayMonth')).toBe('23 Nov');
    expect(formatDate('2026-11-23', 'en-GB', 'weekdayDayMonth')).toBe('Monday 23 November');
  });

  // from memory (CLDR): US English puts the month first; German writes "5. Okt."
  it('follows the locale’s order', () => {
    expect(formatDate('2026-11-23', 'en-US', 'date')).toBe('November 23, 2026');
    expect(formatDate('2026-10-05', 'de-DE', 'dayMonth')).toBe('5. Okt.');
  });

  it('keeps the same calendar day in every runtime time zone', () => {
    // source: IANA tz database: Pacific/Kiritimati is UTC+14, Pacific/Pago_Pago UTC−11
    for (const zone of ['Pacific/Kiritimati', 'Pacific/Pago_Pago', 'America/Los_Angeles', 'UTC']) {
      inZone(zone, () => {
        expect(formatDate('2026-10-05', 'en-GB', 'date')).toBe('5 October 2026');
        expect(formatDate('2026-01-01', 'en-GB', 'dayMonth')).toBe('1 Jan');
      });
    }
  });
});

describe('formatDateTime, formatInstantDate and formatTime of an instant', () => {
  it('give the date and time in the zone given, which may differ from the UTC date', () => {
    // source: IANA tz database: Pacific/Auckland on NZDT (UTC+13) from 2026-09-27; America/Los_Angeles on PDT (UTC−7)
    expect(formatInstantDate('2026-10-05T23:30:00Z', 'en-GB', 'Pacific/Auckland', 'dayMonth')).toBe('6 Oct');
    expect(formatInstantDate('2026-10-05T23:30:00Z', 'en-GB', 'America/Los_Angeles', 'dayMonth')).toBe('5 Oct');
    expect(formatTime('2026-10-05T23:30:00Z', 'en-GB', 'Pacific/Auckland')).toBe('12:30');
  });

  // The complaint was "12/2/2026, 6:31:56 AM" and "02:05 PM" in a UK clinic.
  it('writes a 24-hour clock in British English and the 12-hour one only where the locale does', () => {
    // source: IANA tz database: Europe/London is on GMT on 2026-12-02
    expect(formatDateTime('2026-12-02T14:05:00Z', 'en-GB', 'Europe/London')).toBe('Wed, 2 Dec 2026, 14:05');
    expect(formatTime('2026-12-02T14:05:00Z', 'en-US', 'Europe/London')).toBe('2:05 PM');
  });

  it('shows the repeated hour of the day BST ends as the same time, and skips the missing one', () => {
    // source: IANA tz database: Europe/London BST ends 2026-10-25 at 01:00 UTC and starts 2026-03-29 at 01:00 UTC
    expect(formatTime('2026-10-25T00:30:00Z', 'en-GB', 'Europe/London')).toBe('01:30');
    expect(formatTime('2026-10-25T01:30:00Z', 'en-GB', 'Europe/London')).toBe('01:30');
    expect(formatTime('2026-03-29T01:30:00Z', 'en-GB', 'Europe/London')).toBe('02:30');
  });

  it('does not depend on the runtime time zone', () => {
    const at = '2026-10-05T23:30:00Z';
    expect(inZone('America/New_York', () => formatDateTime(at, 'en-GB', 'Pacific/Auckland', 'dayMonth'))).toBe('6 Oct, 12:30');
  });
});

describe('weekOf', () => {
  it('writes a week as the date it starts', () => {
    // source: PRODUCT.md ISO weeks: 2024-12-30 is the Monday of 2025-W01
    expect(weekOf('2024-12-30', 'en-GB')).toBe('the week of 30 December');
    expect(weekOf('2025-W01', 'en-GB', { year: true })).toBe('the week of 30 December 2024');
    // source: 2026-11-23 is a Monday (date-fns)
    expect(weekOf('2026-W48', 'en-GB')).toBe('the week of 23 November');
  });

  it('finds the Monday of every week key of 2019 to 2032 as luxon does', () => {
    // source: luxon DateTime.fromObject({ weekYear, weekNumber, weekday: 1 })
    for (let year = 2019; year <= 2032; year++) {
      const weeks = DateTime.fromObject({ year, month: 12, day: 28 }, { zone: 'UTC' }).weekNumber;
      for (let week = 1; week <= weeks; week++) {
        const key = `${year}-W${String(week).padStart(2, '0')}`;
        const monday = DateTime.fromObject({ weekYear: year, weekNumber: week, weekday: 1 }, { zone: 'UTC' }).toISODate()!;
        expect(parseIsoWeek(key).monday, key).toBe(monday);
        expect(weekOf(key, 'en-GB', { year: true }), key).toBe(`the week of ${DateTime.fromISO(monday).setLocale('en-GB').toFormat('d MMMM yyyy')}`);
      }
    }
  }, 30_000);
});

describe('dayWords', () => {
  it('says today, tomorrow, the weekday within a week, else the date', () => {
    // source: date-fns: 2026-03-12 is a Thursday
    expect(dayWords('2026-03-12', '2026-03-12', 'en-GB')).toBe('today');
    expect(dayWords('2026-03-13', '2026-03-12', 'en-GB')).toBe('tomorrow');
    expect(dayWords('2026-03-16', '2026-03-12', 'en-GB')).toBe('Monday');
    expect(dayWords('2026-03-19', '2026-03-12', 'en-GB')).toBe('Thursday 19 March');
  });
});

const NOW = new Date('2026-10-14T15:00:00Z');
const before = (days: number) => new Date(NOW.getTime() - days * 86_400_000).toISOString();

describe('daysAgo, relativeDay and openFor', () => {
  it('count calendar days in the zone given, not 24-hour periods nor the runtime’s zone', () => {
    // 28 March 23:30 UTC and 29 March 00:30 UTC are one day apart in UTC and both on 29 March in Auckland.
    // source: IANA tz database: Pacific/Auckland is on NZDT (UTC+13) until 2026-04-05
    const then = '2026-03-28T23:30:00Z';
    const now = new Date('2026-03-29T00:30:00Z');
    expect(daysAgo(then, now, 'UTC')).toBe(1);
    expect(daysAgo(then, now, 'Pacific/Auckland')).toBe(0);
    expect(inZone('Pacific/Auckland', () => daysAgo(then, now, 'UTC'))).toBe(1);
    expect(daysAgo('2026-10-20T09:00:00Z', NOW, 'UTC')).toBe(0);
  });

  it('count the 25-hour day BST ends as one day', () => {
    // source: IANA tz database: Europe/London BST ends 2026-10-25 at 01:00 UTC
    expect(daysAgo('2026-10-24T23:30:00Z', new Date('2026-10-25T23:30:00Z'), 'Europe/London')).toBe(0);
    expect(daysAgo('2026-10-24T22:30:00Z', new Date('2026-10-25T23:30:00Z'), 'Europe/London')).toBe(1);
  });

  it.each([
    [0, 'today'],
    [1, 'yesterday'],
    [13, '13 days ago'],
    [14, '2 weeks ago'],
    [59, '8 weeks ago'],
    [60, '2 months ago'],
    [400, '13 months ago'],
  ])('%i days back reads "%s"', (days, words) => {
    expect(relativeDay(before(days), NOW, 'UTC')).toBe(words);
  });

  it('never reads "1 weeks" nor a shorter span for an older date', () => {
    let last = 0;
    for (let d = 0; d < 800; d++) {
      const words = relativeDay(before(d), NOW, 'UTC');
      expect(words).not.toMatch(/\b1 (days|weeks|months)\b/);
      const n = Number(/\d+/.exec(words)?.[0] ?? 0) * (words.includes('month') ? 30 : words.includes('week') ? 7 : 1);
      expect(n).toBeGreaterThanOrEqual(last - 7);
      last = n;
    }
  });

  it.each([
    [0, 'Raised today'],
    [1, 'Open for 1 day'],
    [21, 'Open for 3 weeks'],
    [100, 'Open for 3 months'],
  ])('%i days after raising reads "%s"', (days, words) => {
    expect(openFor(before(days), NOW, 'UTC')).toBe(words);
  });
});

describe('a snooze date a week ahead', () => {
  it('starts from the client’s local date, not the UTC date', () => {
    const now = new Date('2026-03-28T23:30:00Z');
    // source: IANA tz database: Pacific/Auckland is on NZDT (UTC+13) on 2026-03-29; America/Los_Angeles on PDT (UTC−7)
    expect(addDays(localDate(now, 'Pacific/Auckland'), 7)).toBe('2026-04-05');
    expect(addDays(localDate(now, 'America/Los_Angeles'), 7)).toBe('2026-04-04');
  });
});
