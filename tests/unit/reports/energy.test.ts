import { describe, expect, it } from 'vitest';
import { acsmLegCycling, fesEnergyKcal, sessionWorkJ } from '../../../src/lib/reports/energy';

describe('energy estimates', () => {
  it('gives the ACSM leg-cycling figures of the worked example: 50 W at 70 kg', () => {
    // source: ACSM's Guidelines for Exercise Testing and Prescription, metabolic equations (leg cycling),
    // worked example as PRODUCT.md gathers it: 50 W at 70 kg → 14.87 mL/kg/min, 5.20 kcal/min.
    const { vo2MlKgMin, kcalPerMin } = acsmLegCycling(50, 70);
    expect(vo2MlKgMin).toBeCloseTo(14.87, 2);
    expect(kcalPerMin).toBeCloseTo(5.2, 2);
  });

  it('rises with the work rate and falls with body mass, from the resting and unloaded 7 mL/kg/min', () => {
    // source: ACSM leg-cycling equation, VO2 = 3.5 + 3.5 + 1.8 × WR / BM (WR 0 → 7 mL/kg/min).
    expect(acsmLegCycling(0, 80).vo2MlKgMin).toBeCloseTo(7, 10);
    // 100 W at 70 kg by hand: 1.8 × 611.8 / 70 = 15.732; + 7 = 22.732 mL/kg/min.
    expect(acsmLegCycling(100, 70).vo2MlKgMin).toBeCloseTo(22.732, 3);
    expect(acsmLegCycling(50, 100).vo2MlKgMin).toBeLessThan(acsmLegCycling(50, 70).vo2MlKgMin);
  });

  it('divides the crank work by the efficiency and by 4184 J/kcal', () => {
    // By hand: 30 W for 30 minutes is 54,000 J of work; at 7 % gross efficiency the body spends
    // 54,000 / 0.07 = 771,428.6 J = 184.376 kcal (4184 J per thermochemical kcal, PRODUCT.md).
    expect(fesEnergyKcal(54_000, 7)).toBeCloseTo(184.376, 3);
    // Half the efficiency, twice the energy.
    expect(fesEnergyKcal(54_000, 3.5)).toBeCloseTo(368.752, 3);
    expect(() => fesEnergyKcal(1000, 0)).toThrow(RangeError);
  });

  it('takes the work figure of a session, else its mean power over its active time', () => {
    expect(sessionWorkJ({ workKj: 54, meanPowerW: 10, activeS: 100 })).toBe(54_000);
    expect(sessionWorkJ({ workKj: null, meanPowerW: 20, activeS: 600 })).toBe(12_000);
    expect(sessionWorkJ({ workKj: null, meanPowerW: null, activeS: 600 })).toBeNull();
  });
});
