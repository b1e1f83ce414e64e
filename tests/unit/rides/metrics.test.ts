// summarise() on small series worked out by hand from the definitions in
// PRODUCT.md ("Canonical ride metrics").

import { describe, expect, it } from 'vitest';
import { median } from '../../../src/lib/analytics/median';
import { deltas } from '../../../src/lib/rides/deltas';
import { roundTo } from '../../../src/lib/analytics/round';
import { summarise } from '../../../src/lib/rides/metrics';
import type { Phase, RideSeries } from '../../../src/lib/rides/types';

const f64 = (xs: number[]) => Float64Array.from(xs);
const series = (t: number[], phase: Phase[], extra: Partial<RideSeries> = {}): RideSeries => ({ t: f64(t), phase, channels: {}, ...extra });
const all = (n: number, p: Phase) => new Array<Phase>(n).fill(p);

describe('Δ', () => {
  it('is the step to the next sample, 0 for a pause over 10 s, the median step for the last sample', () => {
    expect([...deltas(f64([0, 1, 2, 20, 21]))]).toEqual([1, 1, 0, 1, 1]);
    expect([...deltas(f64([0, 2, 12, 13]))]).toEqual([2, 10, 1, 2]);
    expect([...deltas(f64([0]))]).toEqual([0]);
    expect(median([3, 1, 2, 10])).toBe(2.5);
  });
});

describe('summarise', () => {
  it('weights means by time and counts phases', () => {
    const s = summarise(
      series([0, 1, 3, 4, 5], ['passive', 'active', 'active', 'active', 'cooldown'], { powerW: f64([100, 10, 40, 20, 0]), cadenceRpm: f64([30, 40, 50, 60, 30]) }),
    );
    // Δ = 1, 2, 1, 1, median(1, 2, 1, 1) = 1; active: power (10·2 + 40·1 + 20·1) / 4 = 20
    expect([s.durationS, s.passiveS, s.activeS, s.cooldownS]).toEqual([6, 1, 4, 1]);
    expect(s.meanPowerW).toBe(20);
    expect(s.meanCadenceRpm).toBe(47.5);
    // work over all samples: 100 + 20 + 40 + 20 + 0 = 180 J
    expect(s.workKj).toBe(0.18);
    // distance from cadence: Σ c/60 · Δ · 2 m = (30 + 80 + 50 + 60 + 30) / 60 · 2 = 8.33… m, to 0.1 m
    expect(s.distanceM).toBe(8.3);
  });

  it('finds the 5 s peak only in windows with 5 s of active Δ', () => {
    const t = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9];
    const phase: Phase[] = ['passive', 'active', 'active', 'active', 'active', 'active', 'active', 'active', 'active', 'cooldown'];
    const powerW = f64([500, 10, 10, 10, 10, 60, 10, 10, 10, 900]);
    const s = summarise(series(t, phase, { powerW }));
    // windows starting at t = 1..4 hold 5 active seconds, each with the 60 W second: (4 · 10 + 60) / 5 = 20;
    // later ones reach the cooldown, and the 500 W and 900 W samples are not active
    expect(s.peakPower5sW).toBe(20);
    expect(summarise(series([0, 1, 2, 3], all(4, 'active'), { powerW: f64([1, 2, 3, 4]) })).peakPower5sW).toBeNull();
  });

  it('leaves negative power out of work', () => {
    expect(summarise(series([0, 1, 2], all(3, 'active'), { powerW: f64([-5, 10, -5]) })).workKj).toBe(0.01);
  });

  it('prefers a distance column (last − first) and takes metres per revolution for cadence', () => {
    expect(summarise(series([0, 1, 2], all(3, 'active'), { distanceM: f64([NaN, 100, 103.5]), cadenceRpm: f64([60, 60, 60]) })).distanceM).toBe(3.5);
    expect(summarise(series([0, 1, 2], all(3, 'active'), { cadenceRpm: f64([60, 60, 60]) }), { metresPerRev: 1.5 }).distanceM).toBe(4.5);
  });

  it('sums channel means per watt, or null below 0.5 W', () => {
    const channels = { quadriceps_left: f64([0, 50, 70]), quadriceps_right: f64([0, 30, 30]) };
    const s = summarise(series([0, 1, 2], ['passive', 'active', 'active'], { powerW: f64([0, 20, 20]), channels }));
    expect(s.channels).toEqual({ quadriceps_left: { meanCurrentMa: 60, maxCurrentMa: 70 }, quadriceps_right: { meanCurrentMa: 30, maxCurrentMa: 30 } });
    expect(s.currentPerWattMaPerW).toBe(4.5);
    const weak = summarise(series([0, 1], all(2, 'active'), { powerW: f64([0.4, 0.4]), channels }));
    expect(weak.currentPerWattMaPerW).toBeNull();
  });

  it('takes plain medians of pulse width and frequency over active samples', () => {
    const s = summarise(series([0, 1, 2, 3], ['passive', 'active', 'active', 'active'], { pulseWidthUs: f64([999, 300, 350, 300]), frequencyHz: f64([0, 35, 40, NaN]) }));
    expect([s.pulseWidthUs, s.frequencyHz]).toEqual([300, 37.5]);
  });

  it('rounds half away from zero', () => {
    expect([roundTo(2.25, 1), roundTo(-2.25, 1), roundTo(-0.01, 1), roundTo(0.0625, 3)]).toEqual([2.3, -2.3, 0, 0.063]);
  });
});
