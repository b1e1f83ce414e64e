// Cells → numbers, one column at a time into Float64Arrays: a single pass per
// column, no per-row objects, Number() for every numeric cell; the clock and
// ISO readers only run for time columns that hold such strings.

import { isBlank, parseClock, parseIsoMs, readNumber, type TimeFormat, detectTimeFormat } from './time';
import { isIdentity, type Unit } from './units';
import { RowTally } from './warnings';

const SECONDS_PER_DAY = 86400;
// Larger plain-number times cannot be a ride (and their differences would lose all precision).
export const MAX_ABS_NUMERIC_TIME = 1e15;
// A time of day that falls by more than half a day has passed midnight.
const ROLLOVER_DROP_S = SECONDS_PER_DAY / 2;

function rowIsBlank(row: string[]): boolean {
  for (let i = 0; i < row.length; i++) if (!isBlank(row[i])) return false;
  return true;
}

export interface TimeColumn {
  /** Raw time per data row in the format's own unit; NaN where unreadable or blank. */
  raw: Float64Array;
  format: TimeFormat | null;
  /** Rows (not blank) whose time could not be read. */
  unreadable: RowTally;
  /** Data row at which a time of day passed midnight, or −1. */
  rollover: number;
}

/**
 * Reads the time column. Its format comes from `format` (an import profile's
 * setting) or else from the first readable cell; cells that do not fit that
 * format are unreadable. Clock times that fall by more than 12 h are taken
 * to have passed midnight. Rows with every cell blank are skipped silently.
 */
export function readTimeColumn(rows: string[][], index: number, format: TimeFormat | null, millisecondsUnit: boolean): TimeColumn {
  const n = rows.length;
  const raw = new Float64Array(n);
  const unreadable = new RowTally();
  let fmt = format;
  let r = 0;
  const miss = (row: number) => {
    raw[row] = NaN;
    if (!rowIsBlank(rows[row])) unreadable.add(row);
  };
  if (fmt === null) {
    for (; r < n; r++) {
      const cell = rows[r][index];
      fmt = cell === undefined ? null : detectTimeFormat(cell, millisecondsUnit);
      if (fmt !== null) break;
      miss(r);
    }
  }
  let rollover = -1;
  if (fmt === 'seconds' || fmt === 'milliseconds') {
    for (; r < n; r++) {
      const v = readNumber(rows[r][index]);
      if (v === v && Math.abs(v) <= MAX_ABS_NUMERIC_TIME) raw[r] = v;
      else miss(r);
    }
  } else if (fmt === 'clock') {
    let offset = 0;
    let previous = NaN;
    for (; r < n; r++) {
      const cell = rows[r][index];
      let v = cell === undefined ? NaN : parseClock(cell);
      if (v !== v) {
        miss(r);
        continue;
      }
      v += offset;
      if (v < previous - ROLLOVER_DROP_S) {
        offset += SECONDS_PER_DAY;
        v += SECONDS_PER_DAY;
        if (rollover < 0) rollover = r;
      }
      previous = v;
      raw[r] = v;
    }
  } else if (fmt === 'iso') {
    for (; r < n; r++) {
      const cell = rows[r][index];
      const v = cell === undefined ? NaN : parseIsoMs(cell);
      if (v === v) raw[r] = v;
      else miss(r);
    }
  }
  return { raw, format: fmt, unreadable, rollover };
}

export interface NumericColumn {
  /** Values in canonical units per data row; NaN for blank, missing or non-numeric cells and rows without a time. */
  values: Float64Array;
  /** Rows with a readable time whose cell is not blank yet not a (finite) number. */
  nonNumeric: RowTally;
}

export function readNumericColumn(rows: string[][], index: number, unit: Unit, time: Float64Array): NumericColumn {
  const n = rows.length;
  const values = new Float64Array(n);
  const nonNumeric = new RowTally();
  const plain = isIdentity(unit);
  const { multiply, divide } = unit;
  for (let r = 0; r < n; r++) {
    if (time[r] !== time[r]) {
      values[r] = NaN;
      continue;
    }
    const cell = rows[r][index];
    if (cell === undefined) {
      values[r] = NaN;
      continue;
    }
    const v = +cell;
    if (v - v !== 0) {
      if (!isBlank(cell)) nonNumeric.add(r);
      values[r] = NaN;
    } else if (v === 0 && isBlank(cell)) {
      values[r] = NaN;
    } else {
      const c = plain ? v : (v * multiply) / divide;
      if (c - c !== 0) nonNumeric.add(r);
      values[r] = c - c === 0 ? c : NaN;
    }
  }
  return { values, nonNumeric };
}
