import { describe, expect, it } from 'vitest';
import { chartSeries, phaseRuns } from '../../../src/lib/sessions/chart-series';
import type { RideSeries } from '../../../src/lib/rides/types';

function series(n: number): RideSeries {
  const t = Float64Array.from({ length: n }, (_, i) => i);
  return {
    t,
    phase: Array.from({ length: n }, (_, i) => (i < 100 ? 'passive' : i < n - 100 ? 'active' : 'cooldown')),
    powerW: Float64Array.from(t, (x) => (x === 4321 ? 95 : x === 6000 ? NaN : 20 + Math.sin(x / 50))),
    channels: { quadriceps_left: Float64Array.from(t, () => 60) },
  };
}

describe('chart series', () => {
  it('reduces to the asked number of points and keeps a one-sample peak (largest-triangle-three-buckets)', () => {
    const out = chartSeries(series(10_000), 600);
    expect(out.downsampled).toBe(true);
    expect(out.powerW!.length).toBe(600);
    expect(out.powerW!.some(([t, v]) => t === 4321 && v === 95)).toBe(true);
    expect(out.powerW![0][0]).toBe(0);
    // The last bucket's point stands for the end of the ride.
    expect(out.powerW!.at(-1)![0]).toBeGreaterThan(9999 - 10_000 / 600);
  });

  it('leaves out missing values and keeps every sample when not asked to reduce', () => {
    const out = chartSeries(series(10_000), null);
    expect(out.downsampled).toBe(false);
    expect(out.powerW!.length).toBe(9_999);
    expect(out.channels.quadriceps_left.length).toBe(10_000);
  });

  it('gives the phases as exact time ranges', () => {
    expect(phaseRuns(series(1000))).toEqual([
      { phase: 'passive', fromS: 0, toS: 99 },
      { phase: 'active', fromS: 100, toS: 899 },
      { phase: 'cooldown', fromS: 900, toS: 999 },
    ]);
  });
});
