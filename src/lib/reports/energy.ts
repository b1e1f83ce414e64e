// Energy estimates for a report. FES cycling turns far less of the body's
// energy into crank work than pedalling by one's own effort, so the estimate
// divides the measured work by an efficiency the clinic sets, and says so.
// The ACSM leg-cycling equation is for volitional cycling only; Kinloop shows it
// beside the estimate for riders who also pedal by their own effort.

/** Joules in a kilocalorie (thermochemical). */
export const JOULES_PER_KCAL = 4184;

/**
 * Gross efficiency of FES cycling that Kinloop assumes when the clinic has set
 * none: about a third of a volitional cyclist's, inside the 2–14 % that studies
 * of FES cycling in spinal cord injury report.
 */
export const DEFAULT_FES_EFFICIENCY_PCT = 7;
export const FES_EFFICIENCY_RANGE_PCT = { min: 2, max: 14 } as const;

/** Estimated energy in kcal for mechanical work in joules (W × s) at a gross efficiency in %. */
export function fesEnergyKcal(workJ: number, efficiencyPct: number): number {
  if (!(efficiencyPct > 0)) throw new RangeError(`efficiency must be above 0 %: ${efficiencyPct}`);
  return workJ / ((efficiencyPct / 100) * JOULES_PER_KCAL);
}

/** A session's crank work in joules: its work figure, else its mean power over its active time. */
export function sessionWorkJ(s: { workKj: number | null; meanPowerW: number | null; activeS: number }): number | null {
  if (s.workKj !== null) return s.workKj * 1000;
  return s.meanPowerW !== null ? Math.max(0, s.meanPowerW) * s.activeS : null;
}

// ACSM metabolic equation for leg cycling: VO2 = 3.5 (rest) + 3.5 (unloaded
// cycling) + 1.8 × work rate ÷ body mass, in mL/kg/min with the work rate in
// kg·m/min; about 5 kcal per litre of oxygen.
const WATT_IN_KGM_PER_MIN = 6.118;
const KCAL_PER_LITRE_O2 = 5;

export interface AcsmFigure {
  vo2MlKgMin: number;
  kcalPerMin: number;
}

/** The ACSM leg-cycling equation at a work rate in watts for a body mass in kg (volitional cycling only). */
export function acsmLegCycling(powerW: number, bodyMassKg: number): AcsmFigure {
  if (!(bodyMassKg > 0)) throw new RangeError(`body mass must be above 0 kg: ${bodyMassKg}`);
  const vo2MlKgMin = 3.5 + 3.5 + (1.8 * Math.max(0, powerW) * WATT_IN_KGM_PER_MIN) / bodyMassKg;
  return { vo2MlKgMin, kcalPerMin: ((vo2MlKgMin * bodyMassKg) / 1000) * KCAL_PER_LITRE_O2 };
}
