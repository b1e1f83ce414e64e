import { describe, expect, it } from 'vitest';
import { getISOWeek, getISOWeekYear, format, addDays as fnsAddDays } from 'date-fns';
import { tz, TZDate } from '@date-fns/tz';
import { addWeeks, datesOfWeek, isoWeekOf, nextWeek, parseIsoWeek, previousWeek, weeksEndingAt } from '../../../src/lib/time/iso-week';
import { addDays, localDate } from '../../../src/lib/time/local-date';
import { startOfLocalDay } from '../../../src/lib/time/zoned';

describe('isoWeekOf on local dates', () => {
  // source: ISO 8601 week dates, as listed in /work/shared/PRODUCT.md
  it.each([
    ['2021-01-03', '2020-W53', 2020, 53],
    ['2024-12-30', '2025-W01', 2025, 1],
    ['2027-01-01', '2026-W53', 2026, 53],
  ])('%s is %s', (date, key, year, week) => {
    const w = isoWeekOf(date, 'UTC');
    expect(w.isoWeek).toBe(key);
    expect(w.year).toBe(year);
    expect(w.week).toBe(week);
  });

  it('gives the Monday and Sunday of the week', () => {
    // source: ISO 8601 (Monday first); 2024-12-30 is a Monday per the PRODUCT.md list
    expect(isoWeekOf('2025-01-05', 'UTC')).toEqual({
      isoWeek: '2025-W01',
      year: 2025,
      week: 1,
      monday: '2024-12-30',
      sunday: '2025-01-05',
    });
  });

  it('does not move a local date by the time zone', () => {
    expect(isoWeekOf('2026-10-11', 'Pacific/Kiritimati').isoWeek).toBe(isoWeekOf('2026-10-11', 'Pacific/Pago_Pago').isoWeek);
  });

  // About 4,400 days against the reference: a second or two on a quiet machine; the budget is for a busy one.
  it('agrees with date-fns getISOWeek/getISOWeekYear over twelve years of days', { timeout: 60_000 }, () => {
    // source: date-fns 4 getISOWeek, getISOWeekYear, evaluated in UTC via @date-fns/tz
    const utc = tz('UTC');
    let day = new Date('2019-12-20T12:00:00Z');
    for (let i = 0; i < 12 * 366; i++, day = fnsAddDays(day, 1, { in: utc })) {
      const date = format(day, 'yyyy-MM-dd', { in: utc });
      const expected = `${getISOWeekYear(day, { in: utc })}-W${String(getISOWeek(day, { in: utc })).padStart(2, '0')}`;
      const week = isoWeekOf(date, 'UTC');
      expect(week.isoWeek, date).toBe(expected);
      expect(week.monday <= date && date <= week.sunday, date).toBe(true);
    }
  });

  it('refuses a date that does not exist', () => {
    expect(() => isoWeekOf('2026-02-30', 'UTC')).toThrow(RangeError);
  });
});

describe('isoWeekOf and localDate on instants in a time zone', () => {
  // source: @date-fns/tz tz() with date-fns format/getISOWeek as the reference
  const reference = (instant: string, zone: string) => {
    const inZone = { in: tz(zone) };
    const d = new Date(instant);
    return {
      date: format(d, 'yyyy-MM-dd', inZone),
      isoWeek: `${getISOWeekYear(d, inZone)}-W${String(getISOWeek(d, inZone)).padStart(2, '0')}`,
    };
  };

  it.each([
    // 23:30 on Sunday 2026-10-11 in Berlin (CEST, UTC+2) is 21:30 UTC the same Sunday
    ['2026-10-11T21:30:00Z', 'Europe/Berlin', '2026-10-11', '2026-W41'],
    // 23:30 on Sunday 2026-11-08 in Berlin (CET, UTC+1) is 22:30 UTC
    ['2026-11-08T22:30:00Z', 'Europe/Berlin', '2026-11-08', '2026-W45'],
    // 00:30 on Monday 2026-10-12 in Sydney (AEDT, UTC+11) is Sunday 13:30 UTC: a new week
    ['2026-10-11T13:30:00Z', 'Australia/Sydney', '2026-10-12', '2026-W42'],
    // 23:30 on Sunday 2026-03-29 in Berlin, the day clocks went forward (CEST from 02:00)
    ['2026-03-29T21:30:00Z', 'Europe/Berlin', '2026-03-29', '2026-W13'],
    // 00:30 on Monday 2026-03-30 in Berlin, just after that change
    ['2026-03-29T22:30:00Z', 'Europe/Berlin', '2026-03-30', '2026-W14'],
    // 23:30 on Sunday 2026-10-25 in Berlin, the day clocks went back (CET from 03:00)
    ['2026-10-25T22:30:00Z', 'Europe/Berlin', '2026-10-25', '2026-W43'],
    // Los Angeles: 22:00 on Sunday 2026-03-08 (PDT from 02:00 that day) is Monday 05:00 UTC
    ['2026-03-09T05:00:00Z', 'America/Los_Angeles', '2026-03-08', '2026-W10'],
    // Los Angeles: 23:59 on Sunday 2026-11-01 (PST again from 02:00) is Monday 07:59 UTC
    ['2026-11-02T07:59:00Z', 'America/Los_Angeles', '2026-11-01', '2026-W44'],
    // Los Angeles: 00:00 on Monday 2026-11-02
    ['2026-11-02T08:00:00Z', 'America/Los_Angeles', '2026-11-02', '2026-W45'],
    // Sydney: 00:30 on Monday 2026-04-06 (AEST again from 03:00 on Sunday 2026-04-05)
    ['2026-04-05T14:30:00Z', 'Australia/Sydney', '2026-04-06', '2026-W15'],
  ])('%s in %s is local %s, week %s', (instant, zone, date, week) => {
    expect(reference(instant, zone)).toEqual({ date, isoWeek: week });
    expect(localDate(instant, zone)).toBe(date);
    expect(isoWeekOf(instant, zone).isoWeek).toBe(week);
  });

  it('accepts instants with an offset and Date objects', () => {
    expect(localDate('2026-10-05T00:30:00+02:00', 'UTC')).toBe('2026-10-04');
    expect(localDate(new Date('2026-10-04T22:30:00Z'), 'Europe/Berlin')).toBe('2026-10-05');
  });

  // About 10,000 instants in four zones, each against the reference: the budget is for a busy machine.
  it('agrees with @date-fns/tz for every 7 hours over two years in four zones', () => {
    // source: @date-fns/tz tz() with date-fns format/getISOWeek
    const zones = ['Europe/Berlin', 'Australia/Sydney', 'America/Los_Angeles', 'Pacific/Auckland'];
    const mismatches: string[] = [];
    for (let ms = Date.parse('2025-12-01T00:00:00Z'); ms < Date.parse('2027-12-01T00:00:00Z'); ms += 7 * 3600_000) {
      const instant = new Date(ms).toISOString();
      for (const zone of zones) {
        const expected = reference(instant, zone);
        const actual = { date: localDate(instant, zone), isoWeek: isoWeekOf(instant, zone).isoWeek };
        if (actual.date !== expected.date || actual.isoWeek !== expected.isoWeek) mismatches.push(`${instant} ${zone}: ${JSON.stringify(actual)} ≠ ${JSON.stringify(expected)}`);
      }
    }
    expect(mismatches).toEqual([]);
  }, 60_000);

  it('refuses an unknown time zone', () => {
    expect(() => localDate('2026-10-05T10:00:00Z', 'Mars/Olympus')).toThrow(RangeError);
  });
});

describe('week arithmetic', () => {
  it('steps across a year with 53 weeks', () => {
    // source: ISO 8601, 2026 has 53 weeks (2027-01-01 is 2026-W53, PRODUCT.md)
    expect(nextWeek('2026-W52').isoWeek).toBe('2026-W53');
    expect(nextWeek('2026-W53').isoWeek).toBe('2027-W01');
    expect(previousWeek('2027-W01').isoWeek).toBe('2026-W53');
    expect(previousWeek('2025-W01').isoWeek).toBe('2024-W52');
    expect(addWeeks('2026-W41', -41).isoWeek).toBe('2025-W52');
  });

  it('lists the last N weeks ending at a week, oldest first', () => {
    expect(weeksEndingAt('2027-W02', 4).map((w) => w.isoWeek)).toEqual(['2026-W52', '2026-W53', '2027-W01', '2027-W02']);
    expect(weeksEndingAt('2027-W02', 0)).toEqual([]);
  });

  it('parses week keys and refuses impossible ones', () => {
    expect(parseIsoWeek('2020-W53').monday).toBe('2020-12-28');
    expect(() => parseIsoWeek('2025-W53')).toThrow(RangeError);
    expect(() => parseIsoWeek('2025-W00')).toThrow(RangeError);
    expect(() => parseIsoWeek('2025-41')).toThrow(RangeError);
  });

  it('lists the days of a week', () => {
    expect(datesOfWeek('2026-W53')).toEqual([
      '2026-12-28', '2026-12-29', '2026-12-30', '2026-12-31', '2027-01-01', '2027-01-02', '2027-01-03',
    ]);
  });
});

describe('local-date helpers', () => {
  it('adds days across month and year ends', () => {
    // from memory: 2024 is a leap year
    expect(addDays('2024-02-28', 1)).toBe('2024-02-29');
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01');
    expect(addDays('2026-03-30', -2)).toBe('2026-03-28');
  });

  it('finds where a local day begins on a DST change day', () => {
    // source: @date-fns/tz TZDate (local midnight in the zone) as the reference
    const midnight = (y: number, m: number, d: number, zone: string) => new Date(new TZDate(y, m - 1, d, zone).getTime()).toISOString();
    expect(startOfLocalDay('2026-03-29', 'Europe/Berlin')).toBe(midnight(2026, 3, 29, 'Europe/Berlin'));
    expect(startOfLocalDay('2026-03-29', 'Europe/Berlin')).toBe('2026-03-28T23:00:00.000Z');
    expect(startOfLocalDay('2026-03-30', 'Europe/Berlin')).toBe(midnight(2026, 3, 30, 'Europe/Berlin'));
    expect(startOfLocalDay('2026-03-30', 'Europe/Berlin')).toBe('2026-03-29T22:00:00.000Z');
    expect(startOfLocalDay('2026-10-12', 'Australia/Sydney')).toBe(midnight(2026, 10, 12, 'Australia/Sydney'));
  });
});
