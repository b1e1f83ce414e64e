// Sample weights Δ (PRODUCT.md, "Canonical ride metrics"): Δi = t(i+1) − t(i),
// an interval longer than 10 s is a pause and weighs 0, and the last sample
// weighs the median of all raw intervals.
import { median } from '../analytics/median';

export const PAUSE_S = 10;
// Times are decimal numbers stored in binary: 22.3 − 12.3 is 10.000000000000002.
// Comparisons against 10 s and 5 s allow this much so that such a step is not a pause.
export const TIME_TOLERANCE_S = 1e-6;

/** Δ for each sample of a strictly increasing time series. */
export function deltas(t: Float64Array): Float64Array {
  const n = t.length;
  const d = new Float64Array(n);
  if (n === 0) return d;
  const raw = new Float64Array(n - 1);
  for (let i = 0; i < n - 1; i++) {
    const step = t[i + 1] - t[i];
    raw[i] = step;
    d[i] = step > PAUSE_S + TIME_TOLERANCE_S ? 0 : step;
  }
  d[n - 1] = n > 1 ? (median(raw) ?? 0) : 0;
  return d;
}
