import { describe, it, expect } from 'vitest';
import { addDays, firstUnpausedOnOrAfter, isoWeekLabel, localDateOf, mondayOf } from '../../../src/lib/rider/calendar';

describe('rider calendar', () => {
  it('labels ISO weeks across year ends', () => {
    // source: ISO 8601 week examples in PRODUCT.md ("Sources for check values")
    expect(isoWeekLabel('2021-01-03')).toBe('2020-W53');
    expect(isoWeekLabel('2024-12-30')).toBe('2025-W01');
    expect(isoWeekLabel('2027-01-01')).toBe('2026-W53');
    expect(mondayOf('2027-01-01')).toBe('2026-12-28');
  });

  it('reads the local date in the client time zone', () => {
    // source: tz database: New Zealand is UTC+13 from 2026-09-27; London leaves BST on 2026-10-25
    expect(localDateOf('2026-10-04T11:30:00Z', 'Pacific/Auckland')).toBe('2026-10-05');
    expect(localDateOf('2026-10-24T23:30:00Z', 'Europe/London')).toBe('2026-10-25');
    expect(localDateOf('2026-10-25T23:30:00Z', 'Europe/London')).toBe('2026-10-25');
    expect(() => localDateOf('2026-10-25T23:30:00Z', 'Mars/Olympus')).toThrow(/time zone/);
  });

  it('adds calendar days over a daylight-saving change', () => {
    expect(addDays('2026-10-24', 2)).toBe('2026-10-26');
    expect(addDays('2026-03-28', 1)).toBe('2026-03-29');
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
