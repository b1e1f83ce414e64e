// Cells → numbers, one row at a time into Float64Arrays: the rows are never
// held as strings, so memory is a few numbers per row whatever the file's
// width. Number() for every numeric cell; the clock and ISO readers only run
// for time columns that hold such strings.

import { isBlank, parseClock, parseIsoMs, readNumber, type TimeFormat, detectTimeFormat } from './time';
import { isIdentity, type Unit } from './units';
import { RowTally } from './warnings';

const SECONDS_PER_DAY = 86400;
// Larger plain-number times cannot be a ride (and their differences would lose all precision).
export const MAX_ABS_NUMERIC_TIME = 1e15;
// A time of day that falls by more than half a day has passed midnight.
const ROLLOVER_DROP_S = SECONDS_PER_DAY / 2;

export function rowIsBlank(row: string[]): boolean {
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
  /** The cell of the first row with the earliest time (the first sample), for its UTC offset. */
  firstCell: string;
}

/**
 * Reads the time column row by row. Its format comes from `format` (an import
 * profile's setting) or else from the first readable cell; cells that do not
 * fit that format are unreadable. Clock times that fall by more than 12 h are
 * taken to have passed midnight. Rows with every cell blank are skipped silently.
 */
export class TimeReader {
  private raw: Float64Array;
  private readonly unreadable = new RowTally();
  private rollover = -1;
  private offset = 0;
  private previous = NaN;
  private earliest = Infinity;
  private firstCell = '';

  constructor(
    capacity: number,
    private format: TimeFormat | null,
    private readonly millisecondsUnit: boolean,
  ) {
    this.raw = new Float64Array(capacity);
  }

  /** Reads row `r`'s time cell; returns the raw time, NaN when the row has none. */
  add(r: number, row: string[], index: number): number {
    const cell = row[index];
    if (this.format === null && cell !== undefined) this.format = detectTimeFormat(cell, this.millisecondsUnit);
    let v = NaN;
    if (cell !== undefined) {
      switch (this.format) {
        case 'seconds':
        case 'milliseconds':
          v = readNumber(cell);
          if (Math.abs(v) > MAX_ABS_NUMERIC_TIME) v = NaN;
          break;
        case 'clock':
          v = parseClock(cell);
          if (v === v) {
            v += this.offset;
            if (v < this.previous - ROLLOVER_DROP_S) {
              this.offset += SECONDS_PER_DAY;
              v += SECONDS_PER_DAY;
              if (this.rollover < 0) this.rollover = r;
            }
            this.previous = v;
          }
          break;
        case 'iso':
          v = parseIsoMs(cell);
          break;
      }
    }
    this.raw[r] = v;
    if (v !== v) {
      if (!rowIsBlank(row)) this.unreadable.add(r);
    } else if (v < this.earliest) {
      this.earliest = v;
      this.firstCell = cell!;
    }
    return v;
  }

  finish(rows: number): TimeColumn {
    return { raw: this.raw.subarray(0, rows), format: this.format, unreadable: this.unreadable, rollover: this.rollover, firstCell: this.firstCell };
  }
}

export interface NumericColumn {
  /** Values in canonical units per data row; NaN for blank, missing or non-numeric cells and rows without a time. */
  values: Float64Array;
  /** Rows with a readable time whose cell is not blank yet not a (finite) number. */
  nonNumeric: RowTally;
}

export class NumericReader {
  private readonly values: Float64Array;
  private readonly nonNumeric = new RowTally();
  private readonly plain: boolean;

  constructor(
    capacity: number,
    readonly index: number,
    private readonly unit: Unit,
  ) {
    this.values = new Float64Array(capacity);
    this.plain = isIdentity(unit);
  }

  /** Reads row `r`'s cell; `timed` is false for a row without a readable time, whose values do not count. */
  add(r: number, row: string[], timed: boolean): void {
    const cell = row[this.index];
    if (!timed || cell === undefined) {
      this.values[r] = NaN;
      return;
    }
    const v = +cell;
    if (v - v !== 0) {
      if (!isBlank(cell)) this.nonNumeric.add(r);
      this.values[r] = NaN;
    } else if (v === 0 && isBlank(cell)) {
      this.values[r] = NaN;
    } else {
      const c = this.plain ? v : (v * this.unit.multiply) / this.unit.divide;
      if (c - c !== 0) this.nonNumeric.add(r);
      this.values[r] = c - c === 0 ? c : NaN;
    }
  }

  finish(rows: number): NumericColumn {
    return { values: this.values.subarray(0, rows), nonNumeric: this.nonNumeric };
  }
}
