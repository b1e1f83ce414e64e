import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { decodeSeries, encodeSeries } from '../../../src/lib/rides/series-codec';
import type { Phase, RideSeries } from '../../../src/lib/rides/types';

function ride(n: number): RideSeries {
  const t = Float64Array.from({ length: n }, (_, i) => i * 0.1);
  return {
    t,
    phase: Array.from({ length: n }, (_, i): Phase => (i < n / 10 ? 'passive' : i > n * 0.9 ? 'cooldown' : 'active')),
    cadenceRpm: Float64Array.from(t, (x) => Math.round((40 + 5 * Math.sin(x / 20)) * 10) / 10),
    powerW: Float64Array.from(t, (x, i) => (i % 97 === 0 ? NaN : Math.round((20 + 3 * Math.sin(x / 7) + ((i * 7919) % 13) / 10) * 10) / 10)),
    pulseWidthUs: new Float64Array(n).fill(300),
    frequencyHz: new Float64Array(n).fill(35),
    channels: { quadriceps_left: Float64Array.from(t, (x) => Math.round(60 + x / 100)), channel_3: new Float64Array(n).fill(0) },
  };
}

describe('series codec', () => {
  it('round-trips every column, keeping missing values missing', () => {
    const s = ride(5000);
    const back = decodeSeries(encodeSeries(s));
    // t is i × 0.1 s in floating point (0.30000000000000004 …); kept to 0.001 s it reads back as the decimal i / 10.
    expect(Array.from(back.t)).toEqual(Array.from({ length: 5000 }, (_, i) => i / 10));
    expect(back.phase).toEqual(s.phase);
    expect(Array.from(back.powerW!)).toEqual(Array.from(s.powerW!));
    expect(Array.from(back.cadenceRpm!)).toEqual(Array.from(s.cadenceRpm!));
    expect(Array.from(back.channels.quadriceps_left!)).toEqual(Array.from(s.channels.quadriceps_left!));
    expect(back.heartRateBpm).toBeUndefined();
    expect(Number.isNaN(back.powerW![0])).toBe(true);
  });

  it('is much smaller than the raw 64-bit values', () => {
    const s = ride(36_000);
    const raw = 36_000 * 8 * 7;
    expect(encodeSeries(s).length).toBeLessThan(raw / 10);
  });

  const roundTrip = (values: number[]) =>
    Array.from(decodeSeries(encodeSeries({ t: Float64Array.from(values, (_, i) => i), phase: values.map(() => 'active'), powerW: Float64Array.from(values), channels: {} })).powerW!);

  it('keeps values to 0.001 of their unit, and a column of huge values to fewer decimals rather than failing', () => {
    // Hand-worked from the stated rule: quantised values must fit 30 bits (2^30 = 1,073,741,824),
    // so a column up to a million keeps 0.001, one reaching two million keeps 0.01, and 2 × 10^8 whole units.
    expect(roundTrip([1_000_000, 0.0014, -3.0006])).toEqual([1_000_000, 0.001, -3.001]);
    expect(roundTrip([2_000_000, 0.014, 12.3456])).toEqual([2_000_000, 0.01, 12.35]);
    expect(roundTrip([200_000_000, 7.4, -7.6])).toEqual([200_000_000, 7, -8]);
  });

  it('never errs by more than half of 0.001 below a million, and by a few parts per billion of the largest value above', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1e7, max: 1e7, noNaN: true }), { minLength: 1, maxLength: 200 }), (values) => {
        const back = roundTrip(values);
        const max = Math.max(...values.map(Math.abs));
        // Below 2^30 / 1000 ≈ 1.07 million the quantum is 0.001; above, the largest
        // power of ten that keeps max / quantum under 2^30, at most 10 × max / 2^30.
        const bound = max < 1_000_000 ? 0.0005 : 5 * (max / 2 ** 30) + 0.0005;
        values.forEach((v, i) => expect(Math.abs(back[i] - v)).toBeLessThanOrEqual(bound + Math.abs(v) * 1e-12 + 1e-9));
      }),
      { numRuns: 200 },
    );
  });
});
