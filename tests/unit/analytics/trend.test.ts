import { describe, expect, it } from 'vitest';
import { linearRegression, median as ssMedian, rSquared } from 'simple-statistics';
import fc from 'fast-check';
import { linearTrend, powerTrendPerWeek } from '../../../src/lib/analytics/trend';
import { median } from '../../../src/lib/analytics/median';

// source: simple-statistics 7 linearRegression / rSquared / median as the reference
function reference(points: { x: number; y: number }[]) {
  const pairs = points.map((p) => [p.x, p.y]);
  const { m, b } = linearRegression(pairs);
  return { slope: m, intercept: b, r2: rSquared(pairs, (x) => m * x + b) };
}

describe('linearTrend', () => {
  it('fits fixed data like simple-statistics', () => {
    const points = [
      { x: 1, y: 2.1 },
      { x: 2, y: 3.9 },
      { x: 3, y: 6.2 },
      { x: 4, y: 7.8 },
      { x: 5, y: 10.1 },
    ];
    const ours = linearTrend(points)!;
    const ref = reference(points);
    expect(ours.slope).toBeCloseTo(ref.slope, 12);
    expect(ours.intercept).toBeCloseTo(ref.intercept, 12);
    expect(ours.r2).toBeCloseTo(ref.r2, 12);
    // source: hand computation, Σ(x−3)(y−6.02) = 19.9, Σ(x−3)² = 10
    expect(ours.slope).toBeCloseTo(1.99, 12);
  });

  it('fits a perfect line with r2 = 1', () => {
    const ours = linearTrend([0, 1, 2, 3].map((x) => ({ x, y: 5 - 2 * x })))!;
    expect(ours.slope).toBeCloseTo(-2, 12);
    expect(ours.intercept).toBeCloseTo(5, 12);
    expect(ours.r2).toBeCloseTo(1, 12);
  });

  it('agrees with simple-statistics on random data, including timestamp-sized x', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ x: fc.double({ min: -1e3, max: 1e3, noNaN: true }), y: fc.double({ min: -1e3, max: 1e3, noNaN: true }) }), { minLength: 3, maxLength: 40 }),
        fc.constantFrom(0, 1.7e12),
        (raw, shift) => {
          const points = raw.map((p) => ({ x: p.x + shift, y: p.y }));
          const spread = Math.max(...raw.map((p) => p.x)) - Math.min(...raw.map((p) => p.x));
          const ySpread = Math.max(...raw.map((p) => p.y)) - Math.min(...raw.map((p) => p.y));
          fc.pre(spread > 1 && ySpread > 1);
          const ours = linearTrend(points)!;
          const ref = reference(points);
          const scale = Math.max(1, Math.abs(ref.slope));
          expect(Math.abs(ours.slope - ref.slope) / scale).toBeLessThan(1e-6);
          expect(Math.abs(ours.r2 - ref.r2)).toBeLessThan(1e-6);
        },
      ),
      { numRuns: 300, seed: 7 },
    );
  });

  it('has no trend for fewer than two points or a single x', () => {
    expect(linearTrend([])).toBeNull();
    expect(linearTrend([{ x: 1, y: 1 }])).toBeNull();
    expect(linearTrend([{ x: 1, y: 1 }, { x: 1, y: 3 }])).toBeNull();
  });

  it('gives r2 = 1 for a flat series', () => {
    expect(linearTrend([{ x: 0, y: 4 }, { x: 1, y: 4 }, { x: 2, y: 4 }])).toEqual({ slope: 0, intercept: 4, r2: 1 });
  });
});

describe('powerTrendPerWeek', () => {
  const now = '2026-10-17T12:00:00.000Z';
  const weeksBefore = (w: number) => new Date(Date.parse(now) - w * 7 * 86_400_000).toISOString();

  it('gives watts per week', () => {
    // 20 W eight weeks ago… rising 1.5 W a week (invented demo numbers)
    const sessions = [7.5, 6, 4, 2, 1, 0].map((w) => ({ startedAt: weeksBefore(w), meanPowerW: 30 - 1.5 * w }));
    expect(powerTrendPerWeek(sessions, now)).toBeCloseTo(1.5, 10);
  });

  it('uses only the window and sessions with a mean power', () => {
    const sessions = [
      { startedAt: weeksBefore(20), meanPowerW: 100 },
      { startedAt: weeksBefore(3), meanPowerW: 10 },
      { startedAt: weeksBefore(2), meanPowerW: null },
      { startedAt: weeksBefore(2), meanPowerW: 11 },
      { startedAt: weeksBefore(1), meanPowerW: 12 },
      { startedAt: weeksBefore(-1), meanPowerW: 0 },
    ];
    expect(powerTrendPerWeek(sessions, now)).toBeCloseTo(1, 10);
    expect(powerTrendPerWeek(sessions, now, 2.5)).toBeNull();
  });

  it('is null with fewer than three sessions', () => {
    expect(powerTrendPerWeek([{ startedAt: weeksBefore(1), meanPowerW: 10 }, { startedAt: weeksBefore(2), meanPowerW: 12 }], now)).toBeNull();
  });
});

describe('median', () => {
  it('agrees with simple-statistics', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -1e6, max: 1e6 }).map((v) => v / 100), { minLength: 1, maxLength: 30 }), (values) => {
        expect(median(values)).toBeCloseTo(ssMedian(values), 9);
      }),
      { numRuns: 200, seed: 11 },
    );
    expect(median([])).toBeNull();
  });
});
