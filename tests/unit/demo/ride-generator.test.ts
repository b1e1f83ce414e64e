// The demo ride generator (invented numbers): shape of the phases, the mean
// power it promises, and reproducibility from the seed.
import { describe, expect, it } from 'vitest';
import { generateRide, type GeneratedRide, type RideSpec } from '../../../src/lib/demo/ride-generator';

const SPEC: RideSpec = {
  startedAt: '2026-10-05T09:30:00+01:00',
  warmupMin: 5,
  activeMin: 30,
  cooldownMin: 4,
  meanPowerW: 24,
  cadenceRpm: 42,
  currents: { quadriceps_left: 84, quadriceps_right: 84, hamstrings_left: 70, hamstrings_right: 70 },
  pulseWidthUs: 300,
  frequencyHz: 35,
  hz: 1,
};

function indices(ride: GeneratedRide, phase: string): number[] {
  return ride.phase.flatMap((p, k) => (p === phase ? [k] : []));
}
const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length;
const at = (series: Float64Array, ks: number[]) => ks.map((k) => series[k]);

describe('generateRide', () => {
  const ride = generateRide(SPEC, 42);
  const passive = indices(ride, 'passive');
  const active = indices(ride, 'active');
  const cooldown = indices(ride, 'cooldown');

  it('writes one sample per 1/hz seconds for each phase in order', () => {
    expect(passive.length).toBe(300);
    expect(active.length).toBe(1800);
    expect(cooldown.length).toBe(240);
    expect(active[0]).toBe(300);
    expect(ride.t[1] - ride.t[0]).toBe(1);
    expect(ride.startedAtMs).toBe(Date.parse('2026-10-05T08:30:00Z'));
  });

  it('keeps the motor-driven phases without stimulation and at 0–2 W', () => {
    for (const k of [...passive, ...cooldown]) {
      for (const current of Object.values(ride.currentsMa)) expect(current![k]).toBe(0);
      expect(ride.pulseWidthUs[k]).toBe(0);
      expect(ride.powerW[k]).toBeGreaterThanOrEqual(0);
      expect(ride.powerW[k]).toBeLessThanOrEqual(2);
    }
    for (const k of passive) expect(Math.abs(ride.cadenceRpm[k] - SPEC.cadenceRpm)).toBeLessThan(1.5);
  });

  it('gives the spec mean power over the active phase', () => {
    expect(mean(at(ride.powerW, active))).toBeCloseTo(SPEC.meanPowerW, 9);
  });

  it('ramps each current up over the first minute, then holds it near the spec', () => {
    for (const [channel, plateau] of Object.entries(SPEC.currents)) {
      const current = ride.currentsMa[channel as keyof typeof SPEC.currents]!;
      expect(current[active[0]]).toBeGreaterThan(0);
      expect(current[active[0]]).toBeLessThan(0.2 * plateau!);
      const settled = mean(at(current, active.slice(60, 900)));
      expect(Math.abs(settled / plateau! - 1)).toBeLessThan(0.05);
      for (const k of active) expect(current[k]).toBeGreaterThan(0);
    }
  });

  it('lets power fade late in the session', () => {
    const middle = mean(at(ride.powerW, active.slice(360, 1080)));
    const end = mean(at(ride.powerW, active.slice(-180)));
    expect(end).toBeLessThan(0.95 * middle);
  });

  it('keeps the active cadence within a few rpm of the target', () => {
    for (const k of active) expect(Math.abs(ride.cadenceRpm[k] - SPEC.cadenceRpm)).toBeLessThanOrEqual(5);
  });

  it('counts distance from the crank turns and raises heart rate while stimulated', () => {
    for (let k = 1; k < ride.t.length; k++) expect(ride.distanceM[k]).toBeGreaterThan(ride.distanceM[k - 1]);
    const expected = (SPEC.cadenceRpm * 35 + (SPEC.cadenceRpm - 5) * 4) * 2;
    expect(Math.abs(ride.distanceM[ride.t.length - 1] / expected - 1)).toBeLessThan(0.03);
    expect(mean(at(ride.heartRateBpm, active.slice(-300)))).toBeGreaterThan(mean(at(ride.heartRateBpm, passive)) + 10);
  });

  it('gives the same ride for the same seed and another for another seed', () => {
    const again = generateRide(SPEC, 42);
    expect(again.powerW).toEqual(ride.powerW);
    expect(again.currentsMa).toEqual(ride.currentsMa);
    expect(again.heartRateBpm).toEqual(ride.heartRateBpm);
    expect(generateRide(SPEC, 43).powerW).not.toEqual(ride.powerW);
  });

  it('samples at other rates with the same phase lengths', () => {
    const fast = generateRide({ ...SPEC, hz: 2 }, 42);
    expect(fast.t.length).toBe(2 * ride.t.length);
    expect(fast.t[1]).toBe(0.5);
    expect(indices(fast, 'active').length).toBe(3600);
  });

  it('refuses specs it cannot sample', () => {
    expect(() => generateRide({ ...SPEC, hz: 0 }, 1)).toThrow(RangeError);
    expect(() => generateRide({ ...SPEC, startedAt: 'Monday' }, 1)).toThrow(RangeError);
    expect(() => generateRide({ ...SPEC, activeMin: -1 }, 1)).toThrow(RangeError);
    expect(() => generateRide({ ...SPEC, warmupMin: 0, activeMin: 0, cooldownMin: 0 }, 1)).toThrow(RangeError);
  });
});
