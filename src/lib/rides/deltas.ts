// Sample weights Δ (PRODUCT.md, "Canonical ride metrics"): Δi = t(i+1) − t(i),
// an interval longer than 10 s is a pause and weighs 0, and the last sample
// weighs the median of all raw intervals.

export const PAUSE_S = 10;
// Times are decimal numbers stored in binary: 22.3 − 12.3 is 10.000000000000002.
// Comparisons against 10 s and 5 s allow this much so that such a step is not a pause.
export const TIME_TOLERANCE_S = 1e-6;

/** The median of the finite values (mean of the middle two for an even count); NaN when there are none. */
export function median(values: ArrayLike<number>): number {
  const finite = new Float64Array(values.length);
  let n = 0;
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i])) finite[n++] = values[i];
  const sorted = finite.subarray(0, n).sort();
  if (n === 0) return NaN;
  const mid = n >> 1;
  return n % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

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
  d[n - 1] = n > 1 ? median(raw) : 0;
  return d;
}
