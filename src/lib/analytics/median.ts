// The one median: the middle value of the finite values, or the mean of the
// two middle values for an even count (common practice); null when there are
// none. Typed-array sorting keeps it fast on a ride's thousands of samples.
export function median(values: ArrayLike<number>): number | null {
  const finite = new Float64Array(values.length);
  let n = 0;
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i])) finite[n++] = values[i];
  if (n === 0) return null;
  const sorted = finite.subarray(0, n).sort();
  const mid = n >> 1;
  return n % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}
