import { describe, expect, it } from 'vitest';
import { addMonths as fnsAddMonths, differenceInCalendarDays } from 'date-fns';
import { isoWeekKey } from '../../../src/lib/time/iso-week';
import { addDays, addMonths, assertLocalDate, daysFrom, isoWeekday, localDate, mondayOf } from '../../../src/lib/time/local-date';
import { firstUnpausedOnOrAfter } from '../../../src/lib/rider/pauses';

describe('local dates', () => {
  it('labels ISO weeks across year ends', () => {
    // source: ISO 8601 week examples in PRODUCT.md ("Sources for check values")
    expect(isoWeekKey('2021-01-03')).toBe('2020-W53');
    expect(isoWeekKey('2024-12-30')).toBe('2025-W01');
    expect(isoWeekKey('2027-01-01')).toBe('2026-W53');
    expect(mondayOf('2027-01-01')).toBe('2026-12-28');
    // source: 2026-11-23 is a Monday (PRODUCT.md: 2024-12-30 is a Monday, 2026-11-23 is 99 weeks later)
    expect(isoWeekday('2026-11-23')).toBe(1);
    expect(isoWeekday('2026-11-29')).toBe(7);
  });

  it('reads the local date in the client time zone', () => {
    // source: tz database: New Zealand is UTC+13 from 2026-09-27; London leaves BST on 2026-10-25
    expect(localDate('2026-10-04T11:30:00Z', 'Pacific/Auckland')).toBe('2026-10-05');
    expect(localDate('2026-10-24T23:30:00Z', 'Europe/London')).toBe('2026-10-25');
    expect(localDate('2026-10-25T23:30:00Z', 'Europe/London')).toBe('2026-10-25');
    expect(() => localDate('2026-10-25T23:30:00Z', 'Mars/Olympus')).toThrow(/time zone/);
  });

  it('refuses an instant that does not say its offset, which each runtime would read in its own zone', () => {
    expect(() => localDate('2026-10-25T23:30:00', 'Europe/London')).toThrow(/offset/);
    expect(() => localDate('yesterday', 'Europe/London')).toThrow(RangeError);
  });

  it('adds calendar days over a daylight-saving change', () => {
    expect(addDays('2026-10-24', 2)).toBe('2026-10-26');
    expect(addDays('2026-03-28', 1)).toBe('2026-03-29');
    expect(() => assertLocalDate('2026-02-30')).toThrow(RangeError);
  });

  it('counts days and adds months as date-fns does', () => {
    // source: date-fns differenceInCalendarDays and addMonths (month end clamped) as the reference
    const cases: [string, string][] = [['2026-01-31', '2026-03-01'], ['2024-02-29', '2025-02-28'], ['2026-12-31', '2026-01-01']];
    for (const [a, b] of cases) {
      expect(daysFrom(a, b)).toBe(differenceInCalendarDays(new Date(`${b}T12:00:00Z`), new Date(`${a}T12:00:00Z`)));
    }
    for (const [date, months] of [['2026-01-31', 1], ['2024-02-29', 12], ['2026-03-31', -1], ['2026-11-15', 3]] as const) {
      const expected = fnsAddMonths(new Date(`${date}T12:00:00Z`), months).toISOString().slice(0, 10);
      expect(addMonths(date, months)).toBe(expected);
    }
  });

  it('skips chained pauses and stops at an open-ended one', () => {
    const pauses = [
      { start: '2026-10-05', end: '2026-10-09' },
      { start: '2026-10-10', end: '2026-10-12' },
    ];
    expect(firstUnpausedOnOrAfter('2026-10-06', pauses)).toBe('2026-10-13');
    expect(firstUnpausedOnOrAfter('2026-10-04', pauses)).toBe('2026-10-04');
    expect(firstUnpausedOnOrAfter('2026-10-06', [{ start: '2026-10-01', end: null }])).toBeNull();
  });
});
