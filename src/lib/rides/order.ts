// Samples in time order: rows without a readable time left out, the rest
// sorted by time (stable, so the file's first of equal times comes first), and
// a row with the same time as the row before it dropped.

import { RowTally } from './warnings';

export interface RowOrder {
  /** Data-row indices of the samples kept, in time order. */
  keep: Int32Array;
  /** keep is 0, 1, 2, … (every row kept, already in order): columns need no reordering. */
  identity: boolean;
  /** First data row found earlier in time than the row before it, or −1. */
  firstOutOfOrder: number;
  duplicates: RowTally;
}

export function orderRows(time: Float64Array): RowOrder {
  const n = time.length;
  const valid = new Int32Array(n);
  let count = 0;
  let previous = -Infinity;
  let firstOutOfOrder = -1;
  for (let r = 0; r < n; r++) {
    const v = time[r];
    if (v !== v) continue;
    if (v < previous && firstOutOfOrder < 0) firstOutOfOrder = r;
    previous = v;
    valid[count++] = r;
  }
  let ordered = valid.subarray(0, count);
  if (firstOutOfOrder >= 0) {
    ordered = Int32Array.from(Array.from(ordered).sort((a, b) => time[a] - time[b] || a - b));
  }
  const keep = new Int32Array(count);
  const duplicates = new RowTally();
  let kept = 0;
  let last = NaN;
  for (let k = 0; k < count; k++) {
    const r = ordered[k];
    if (time[r] === last) {
      duplicates.add(r);
      continue;
    }
    last = time[r];
    keep[kept++] = r;
  }
  return { keep: keep.subarray(0, kept), identity: kept === n && firstOutOfOrder < 0, firstOutOfOrder, duplicates };
}

/** The values of the kept rows, in sample order. */
export function pick(values: Float64Array, order: RowOrder): Float64Array {
  if (order.identity) return values;
  const out = new Float64Array(order.keep.length);
  for (let k = 0; k < out.length; k++) out[k] = values[order.keep[k]];
  return out;
}
