import { describe, it, expect } from 'vitest';
import { DateTime } from 'luxon';
import { addDays, dayLabel, dayMonth, instantLabel, mondayOfIsoWeek, shortDay, startDay, startTime } from '../../../src/components/client/dates';
import { inZone } from './time-zone';

describe('dayLabel and dayMonth of a local date', () => {
  it('give the date with a short weekday and month', () => {
    // source: date-fns format('EEE'): 2026-10-05 is a Monday
    const label = dayLabel('2026-10-05', 'en-GB');
    expect(label).toContain('Mon');
    expect(label).toContain('5 Oct 2026');
    expect(dayMonth('2026-10-05', 'en-GB')).toBe('5 Oct');
  });

  it('keep the same calendar day in every runtime time zone', () => {
    // source: IANA tz database: Pacific/Kiritimati is UTC+14, Pacific/Pago_Pago UTC−11
    for (const zone of ['Pacific/Kiritimati', 'Pacific/Pago_Pago', 'America/Los_Angeles', 'UTC']) {
      inZone(zone, () => {
        expect(dayLabel('2026-10-05', 'en-GB')).toContain('5 Oct 2026');
        expect(dayMonth('2026-01-01', 'en-GB')).toBe('1 Jan');
      });
    }
  });

  // from memory (CLDR de): day, full stop, abbreviated month with its own full stop.
  it('word the date in the locale', () => {
    expect(dayMonth('2026-10-05', 'de-DE')).toBe('5. Okt.');
  });
});

describe('shortDay, instantLabel, startDay and startTime of an instant', () => {
  it('give the date in the client’s zone, which may differ from the UTC date', () => {
    // source: IANA tz database: Pacific/Auckland on NZDT (UTC+13) from 2026-09-27; America/Los_Angeles on PDT (UTC−7)
    expect(shortDay('2026-10-05T23:30:00Z', 'en-GB', 'Pacific/Auckland')).toBe('6 Oct');
    expect(shortDay('2026-10-05T23:30:00Z', 'en-GB', 'America/Los_Angeles')).toBe('5 Oct');
    expect(startDay('2026-10-05T23:30:00Z', 'en-GB', 'Pacific/Auckland')).toContain('Tue');
  });

  it('give the clock time in the client’s zone', () => {
    // source: IANA tz database: Europe/London on BST (UTC+1) on 2026-10-05
    expect(startTime('2026-10-05T09:15:00Z', 'en-GB', 'Europe/London')).toBe('10:15');
    expect(startTime('2026-10-05T09:15:00Z', 'en-GB', 'UTC')).toBe('09:15');
    expect(instantLabel('2026-10-05T15:30:00Z', 'en-GB', 'Europe/London')).toContain('5 Oct 2026');
    expect(instantLabel('2026-10-05T15:30:00Z', 'en-GB', 'Europe/London')).toContain('16:30');
  });

  it('show the repeated hour of the day BST ends as the same time', () => {
    // source: IANA tz database: Europe/London BST ends 2026-10-25 at 01:00 UTC
    expect(instantLabel('2026-10-25T00:30:00Z', 'en-GB', 'Europe/London')).toContain('01:30');
    expect(instantLabel('2026-10-25T01:30:00Z', 'en-GB', 'Europe/London')).toContain('01:30');
    expect(startTime('2026-10-25T02:30:00Z', 'en-GB', 'Europe/London')).toBe('02:30');
  });

  it('do not depend on the runtime time zone', () => {
    const at = '2026-10-05T23:30:00Z';
    const here = inZone('America/New_York', () => [shortDay(at, 'en-GB', 'Pacific/Auckland'), startTime(at, 'en-GB', 'Pacific/Auckland')]);
    expect(here).toEqual(['6 Oct', '12:30']);
  });
});

describe('addDays', () => {
  it('adds and subtracts whole calendar days', () => {
    expect(addDays('2026-10-05', 0)).toBe('2026-10-05');
    expect(addDays('2026-10-05', 7)).toBe('2026-10-12');
    expect(addDays('2026-10-05', -5)).toBe('2026-09-30');
  });

  it('rolls over months, years and leap days', () => {
    // source: Gregorian calendar rule: 2028 is a leap year, 2026 and 2100 are not, 2000 was
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01');
    expect(addDays('2028-02-28', 1)).toBe('2028-02-29');
    expect(addDays('2026-02-28', 1)).toBe('2026-03-01');
    expect(addDays('2100-02-28', 1)).toBe('2100-03-01');
    expect(addDays('2000-02-28', 1)).toBe('2000-02-29');
  });

  it('keeps whole days across a DST change in any runtime zone', () => {
    // source: IANA tz database: Europe/London BST starts 2026-03-29 and ends 2026-10-25
    inZone('Europe/London', () => {
      expect(addDays('2026-03-28', 1)).toBe('2026-03-29');
      expect(addDays('2026-03-29', 1)).toBe('2026-03-30');
      expect(addDays('2026-10-24', 2)).toBe('2026-10-26');
    });
  });
});

describe('mondayOfIsoWeek', () => {
  it('matches the cases listed in the product brief', () => {
    // source: PRODUCT.md ISO 8601 weeks: 2021-01-03 is in 2020-W53, 2024-12-30 is 2025-W01, 2027-01-01 is in 2026-W53
    expect(mondayOfIsoWeek('2020-W53')).toBe('2020-12-28');
    expect(mondayOfIsoWeek('2025-W01')).toBe('2024-12-30');
    expect(mondayOfIsoWeek('2026-W53')).toBe('2026-12-28');
  });

  it('gives week 1 a Monday in the old year when 4 January is a Sunday, and 4 January itself when it is a Monday', () => {
    // source: luxon DateTime.fromISO('2026-W01') → 2025-12-29; 2021-01-04 is a Monday (date-fns)
    expect(mondayOfIsoWeek('2026-W01')).toBe('2025-12-29');
    expect(mondayOfIsoWeek('2021-W01')).toBe('2021-01-04');
  });

  it('matches luxon for every week of 2019 to 2032', () => {
    // source: luxon DateTime.fromObject({ weekYear, weekNumber, weekday: 1 }); 28 December is always
    // in the last ISO week of its year (ISO 8601, from memory), so its week number is the year's count
    for (let year = 2019; year <= 2032; year++) {
      const weeks = DateTime.fromObject({ year, month: 12, day: 28 }, { zone: 'UTC' }).weekNumber;
      for (let week = 1; week <= weeks; week++) {
        const key = `${year}-W${String(week).padStart(2, '0')}`;
        const expected = DateTime.fromObject({ weekYear: year, weekNumber: week, weekday: 1 }, { zone: 'UTC' }).toISODate();
        expect(mondayOfIsoWeek(key), key).toBe(expected);
      }
    }
  });

  it('gives a Monday in any runtime zone', () => {
    const monday = inZone('Pacific/Kiritimati', () => mondayOfIsoWeek('2026-W41'));
    expect(monday).toBe('2026-10-05');
    expect(new Date(`${monday}T12:00:00Z`).getUTCDay()).toBe(1);
  });
});
