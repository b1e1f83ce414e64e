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
    expect(Array.from(back.t)).toEqual(Array.from(s.t).map((v) => Math.round(v * 1000) / 1000));
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

  it('keeps values to 0.001 of their unit, and a column of huge values to fewer decimals rather than failing', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1e7, max: 1e7, noNaN: true }), { minLength: 1, maxLength: 200 }), (values) => {
        const s: RideSeries = { t: Float64Array.from(values, (_, i) => i), phase: values.map(() => 'active'), powerW: Float64Array.from(values), channels: {} };
        const back = decodeSeries(encodeSeries(s)).powerW!;
        // A column is quantised to 0.001 unless its largest value needs fewer
        // decimals to fit 30 bits; the error is half the quantum used, plus the
        // floating-point error of scaling.
        const max = Math.max(...values.map(Math.abs));
        let scale = 1000;
        while (max * scale >= 2 ** 30) scale /= 10;
        values.forEach((v, i) => expect(Math.abs(back[i] - v)).toBeLessThanOrEqual(0.5 / scale + Math.abs(v) * 1e-12 + 1e-9));
      }),
    );
  });
});
