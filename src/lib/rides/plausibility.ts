// Physical limits (PRODUCT.md "Plausibility"): a value outside them is dropped
// from its sample (set to NaN) and reported, never silently kept. Beyond the
// listed upper limits, negative cadence, current, pulse width, frequency and
// heart rate are impossible too, and power is bounded on both sides because
// a motor can brake the crank (negative power) but not by more than it can push.

import type { Quantity } from './units';
import { counted, linesOf, RowTally } from './warnings';

export interface Limit {
  min: number;
  max: number;
  unit: string;
}

export const LIMITS: Record<Exclude<Quantity, 'time' | 'distance'>, Limit> = {
  cadence: { min: 0, max: 150, unit: 'rpm' },
  power: { min: -1000, max: 1000, unit: 'W' },
  current: { min: 0, max: 200, unit: 'mA' },
  pulse_width: { min: 0, max: 1000, unit: 'µs' },
  frequency: { min: 0, max: 100, unit: 'Hz' },
  heart_rate: { min: 0, max: 250, unit: 'bpm' },
};

/**
 * Sets values outside the quantity's limits to NaN, in place. `rowOf` gives
 * each sample's data row for the warning's line span. Returns the warnings.
 */
export function dropImplausible(
  values: Float64Array,
  quantity: Quantity,
  label: string,
  rowOf: Int32Array,
  lineOf: (row: number) => number,
): string[] {
  if (quantity === 'time' || quantity === 'distance') return [];
  const limit = LIMITS[quantity];
  const low = new RowTally();
  const high = new RowTally();
  for (let k = 0; k < values.length; k++) {
    const v = values[k];
    if (v > limit.max) {
      high.add(rowOf[k]);
      values[k] = NaN;
    } else if (v < limit.min) {
      low.add(rowOf[k]);
      values[k] = NaN;
    }
  }
  const out: string[] = [];
  if (low.count > 0) out.push(`${counted(low.count, `${label} value below ${limit.min} ${limit.unit}`, `${label} values below ${limit.min} ${limit.unit}`)} dropped ${linesOf(low, lineOf)}`);
  if (high.count > 0) out.push(`${counted(high.count, `${label} value above ${limit.max} ${limit.unit}`, `${label} values above ${limit.max} ${limit.unit}`)} dropped ${linesOf(high, lineOf)}`);
  return out;
}
