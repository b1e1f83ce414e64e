// The data rows, read once: papaparse splits the text (RFC 4180 quoting) and
// hands over one row at a time; each row's time, measurements and phase word
// are taken from it at once, so the rows are never all held as strings.

import Papa from 'papaparse';
import { NumericReader, TimeReader, type NumericColumn, type TimeColumn } from './columns';
import { papaNewline, type Delimiter } from './csv';
import type { TimeFormat } from './time';
import type { Unit } from './units';

export interface RowSpec {
  timeIndex: number;
  /** The import profile's time format, else null (told from the first readable cell). */
  timeFormat: TimeFormat | null;
  millisecondsUnit: boolean;
  numeric: { index: number; unit: Unit }[];
  /** Index of the phase column, or −1. */
  phaseIndex: number;
}

export interface RowData {
  rows: number;
  time: TimeColumn;
  /** In the order of `spec.numeric`. */
  numeric: NumericColumn[];
  /** Phase cell per data row, or null without a phase column. */
  phaseCells: (string | undefined)[] | null;
  /** File line of a data row. */
  lineOf: (row: number) => number;
  /** Whether any row holds more than one blank cell. */
  anyRow: boolean;
}

// Phase words repeat on every row; the same few strings are kept once.
const MAX_INTERNED = 64;

/**
 * Reads the rows of `data` (the text after the header row). `capacity` is an
 * upper bound for the row count (the number of lines).
 */
export function readRows(data: string, delimiter: Delimiter, lineBreak: '\n' | '\r', firstLine: number, capacity: number, spec: RowSpec): RowData {
  const time = new TimeReader(capacity, spec.timeFormat, spec.millisecondsUnit);
  const numeric = spec.numeric.map((c) => new NumericReader(capacity, c.index, c.unit));
  const phaseCells = spec.phaseIndex >= 0 ? new Array<string | undefined>(capacity) : null;
  const interned = new Map<string, string>();
  // Quoted cells may hold line breaks: then each row's line is counted.
  const quoted = data.includes('"');
  const lines = quoted ? new Int32Array(capacity) : null;
  const stripCr = lineBreak === '\n' && data.includes('\r');
  let line = firstLine;
  let r = 0;
  let anyRow = false;

  const take = (row: string[]) => {
    if (stripCr) {
      const end = row.length - 1;
      if (row[end].endsWith('\r')) row[end] = row[end].slice(0, -1);
    }
    if (lines !== null) {
      lines[r] = line;
      line++;
      for (const cell of row) for (let i = cell.indexOf(lineBreak); i >= 0; i = cell.indexOf(lineBreak, i + 1)) line++;
    }
    if (!(row.length === 1 && row[0].trim() === '')) anyRow = true;
    const t = time.add(r, row, spec.timeIndex);
    const timed = t === t;
    for (const reader of numeric) reader.add(r, row, timed);
    if (phaseCells !== null) {
      const cell = row[spec.phaseIndex];
      let kept = cell === undefined ? undefined : interned.get(cell);
      if (kept === undefined && cell !== undefined) {
        kept = cell;
        if (interned.size < MAX_INTERNED) interned.set(cell, cell);
      }
      phaseCells[r] = kept;
    }
    r++;
  };

  // A text ending in a line break gives papaparse a last row of one empty
  // cell, which is not a row of the file: each row is taken when the next arrives.
  let pending: string[] | null = null;
  if (data !== '') {
    Papa.parse<string[]>(data, {
      delimiter,
      newline: papaNewline(data, lineBreak),
      header: false,
      skipEmptyLines: false,
      step: (result) => {
        if (pending !== null) take(pending);
        pending = result.data;
      },
    });
  }
  const last = pending as string[] | null;
  if (last !== null && !(last.length === 1 && last[0] === '')) take(last);

  if (phaseCells !== null) phaseCells.length = r;
  return {
    rows: r,
    time: time.finish(r),
    numeric: numeric.map((reader) => reader.finish(r)),
    phaseCells,
    lineOf: lines === null ? (row) => firstLine + row : (row) => lines[row],
    anyRow,
  };
}
