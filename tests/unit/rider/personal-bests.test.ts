import { describe, it, expect } from 'vitest';
import { personalBests } from '../../../src/lib/rider/personal-bests';

const ride = (id: string, startedAt: string | null, activeS: number, peakPower5sW: number | null, distanceM: number | null) => ({
  id,
  startedAt,
  activeS,
  peakPower5sW,
  distanceM,
});

describe('personalBests', () => {
  it('finds the longest ride, the best 5-second power and the biggest week', () => {
    const r = personalBests(
      [
        ride('a', '2026-10-05T01:00:00Z', 1200, 22, 3000),
        ride('b', '2026-10-07T01:00:00Z', 1800, 35.5, 4000),
        ride('c', '2026-10-13T01:00:00Z', 1500, 30, 5000),
        ride('d', '2026-10-15T01:00:00Z', 900, null, 2500),
        ride('e', null, 2400, 12, 9000),
      ],
      'Pacific/Auckland',
    );
    expect(r.longestActive).toEqual({ sessionId: 'e', startedAt: null, activeS: 2400 });
    expect(r.highestPower5s).toEqual({ sessionId: 'b', startedAt: '2026-10-07T01:00:00Z', peakPower5sW: 35.5 });
    // ride e has no start time, so it cannot be placed in a week
    expect(r.mostDistanceWeek).toEqual({ isoWeek: '2026-W42', monday: '2026-10-12', distanceM: 7500, sessions: 2 });
  });

  it('leaves out sessions too short to count', () => {
    const r = personalBests(
      [
        { ...ride('short', '2026-10-05T01:00:00Z', 2400, 80, 9000), counted: false },
        { ...ride('full', '2026-10-07T01:00:00Z', 1800, 35.5, 4000), counted: true },
      ],
      'Europe/London',
    );
    expect(r.longestActive?.sessionId).toBe('full');
    expect(r.highestPower5s?.sessionId).toBe('full');
    expect(r.mostDistanceWeek).toEqual({ isoWeek: '2026-W41', monday: '2026-10-05', distanceM: 4000, sessions: 1 });
  });

  it('keeps the earlier ride on a tie', () => {
    const r = personalBests(
      [ride('late', '2026-10-09T01:00:00Z', 1800, 40, 1000), ride('early', '2026-10-06T01:00:00Z', 1800, 40, 1000)],
      'UTC',
    );
    expect(r.longestActive?.sessionId).toBe('early');
    expect(r.highestPower5s?.sessionId).toBe('early');
  });

  it('puts a ride in the week of its local date', () => {
    const r = personalBests(
      [
        ride('sun', '2026-10-04T10:00:00Z', 600, 10, 1000), // Sunday 23:00 in Auckland, W40
        ride('mon', '2026-10-04T11:30:00Z', 600, 10, 1500), // Monday 00:30 in Auckland, W41
      ],
      'Pacific/Auckland',
    );
    expect(r.mostDistanceWeek).toMatchObject({ isoWeek: '2026-W41', distanceM: 1500, sessions: 1 });
    const utc = personalBests(
      [ride('sun', '2026-10-04T10:00:00Z', 600, 10, 1000), ride('mon', '2026-10-04T11:30:00Z', 600, 10, 1500)],
      'UTC',
    );
    expect(utc.mostDistanceWeek).toMatchObject({ isoWeek: '2026-W40', distanceM: 2500, sessions: 2 });
  });

  it('has no bests without rides or with only zeros', () => {
    expect(personalBests([], 'UTC')).toEqual({ longestActive: null, highestPower5s: null, mostDistanceWeek: null });
    expect(personalBests([ride('z', '2026-10-05T01:00:00Z', 0, 0, 0)], 'UTC')).toEqual({
      longestActive: null,
      highestPower5s: null,
      mostDistanceWeek: null,
    });
  });
});
