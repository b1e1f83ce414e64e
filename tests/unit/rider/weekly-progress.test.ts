import { describe, it, expect } from 'vitest';
import { weeklyProgress } from '../../../src/lib/rider/weekly-progress';

const ride = (startedAt: string | null, activeS: number, meanPowerW: number | null, distanceM: number | null) => ({
  startedAt,
  activeS,
  meanPowerW,
  distanceM,
});

describe('weeklyProgress', () => {
  it('lists every week from the program start to now, empty weeks included', () => {
    const weeks = weeklyProgress([ride('2026-10-06T08:00:00Z', 600, 10, 1200)], 'Europe/London', '2026-10-07', '2026-10-21T12:00:00Z');
    expect(weeks.map((w) => w.isoWeek)).toEqual(['2026-W41', '2026-W42', '2026-W43']);
    expect(weeks[0]).toEqual({ isoWeek: '2026-W41', monday: '2026-10-05', sessions: 1, activeMinutes: 10, distanceM: 1200, meanPowerW: 10 });
    expect(weeks[1]).toEqual({ isoWeek: '2026-W42', monday: '2026-10-12', sessions: 0, activeMinutes: 0, distanceM: 0, meanPowerW: null });
  });

  it('weights mean power by active time', () => {
    const weeks = weeklyProgress(
      [ride('2026-10-06T08:00:00Z', 600, 10, 1000), ride('2026-10-08T08:00:00Z', 1800, 30, null), ride('2026-10-09T08:00:00Z', 900, null, 500)],
      'UTC',
      '2026-10-05',
      '2026-10-09T12:00:00Z',
    );
    expect(weeks).toHaveLength(1);
    // (10 W × 600 s + 30 W × 1800 s) / 2400 s
    expect(weeks[0].meanPowerW).toBe(25);
    expect(weeks[0].activeMinutes).toBe(55);
    expect(weeks[0].distanceM).toBe(1500);
    expect(weeks[0].sessions).toBe(3);
  });

  it('runs across the ISO year end', () => {
    const weeks = weeklyProgress([ride('2027-01-01T09:00:00Z', 1200, 20, 2000)], 'UTC', '2026-12-28', '2027-01-05T09:00:00Z');
    // source: PRODUCT.md ISO 8601 examples: 2027-01-01 is in 2026-W53
    expect(weeks.map((w) => w.isoWeek)).toEqual(['2026-W53', '2027-W01']);
    expect(weeks[0].sessions).toBe(1);
  });

  it('places rides by the local date and leaves out rides outside the program weeks', () => {
    const weeks = weeklyProgress(
      [
        ride('2026-10-04T11:30:00Z', 600, 10, 100), // Monday 00:30 in Auckland: W41
        ride('2026-09-20T01:00:00Z', 600, 10, 100), // before the program
        ride(null, 600, 10, 100),
      ],
      'Pacific/Auckland',
      '2026-10-05',
      '2026-10-06T00:00:00Z',
    );
    expect(weeks).toHaveLength(1);
    expect(weeks[0]).toMatchObject({ isoWeek: '2026-W41', sessions: 1 });
  });
});
