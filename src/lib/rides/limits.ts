// What one ride file may hold, so that reading any file costs time and memory
// in proportion to its bytes with a small constant. Each limit is far above
// what a cycle exports (a 10 Hz hour is 36,000 rows of about 20 columns and
// 60 bytes) and has a refusal of its own: nothing is clipped silently.

/** Characters in one line: a real row has well under 1 kB, a header of 100 columns a few kB. */
export const MAX_LINE_LENGTH = 16 * 1024;
/** Cells in one row: the field table names about 25 columns. */
export const MAX_COLUMNS = 200;
/** Lines after the header row: almost 14 hours at 10 Hz, 1 h 23 min at 100 Hz. */
export const MAX_ROWS = 500_000;

export type LimitProblem =
  | { code: 'line_too_long'; line: number; length: number }
  | { code: 'too_many_columns'; line: number; columns: number }
  | { code: 'too_many_rows'; rows: number; line: number };

/**
 * The first line longer than MAX_LINE_LENGTH, or null. One indexOf per line,
 * so it costs a fraction of reading the file.
 */
export function longLine(text: string, lineBreak: '\n' | '\r'): LimitProblem | null {
  let start = 0;
  for (let line = 1; start <= text.length; line++) {
    let stop = text.indexOf(lineBreak, start);
    if (stop < 0) stop = text.length;
    // The CR of a CRLF line break is not part of the line.
    const length = stop - start - (stop > start && text.charCodeAt(stop - 1) === 13 ? 1 : 0);
    if (length > MAX_LINE_LENGTH) return { code: 'line_too_long', line, length };
    start = stop + 1;
  }
  return null;
}

/** Cells in a line for a delimiter, counting at most `MAX_COLUMNS + 1`. */
export function cellsUpTo(line: string, delimiter: string): number {
  let cells = 1;
  for (let i = line.indexOf(delimiter); i >= 0; i = line.indexOf(delimiter, i + 1)) {
    if (++cells > MAX_COLUMNS) return cells;
  }
  return cells;
}

/**
 * Checks the lines after the header row against the row and column limits
 * before any of them is split into cells, and counts them (an upper bound
 * for the rows, which quoted line breaks can only make fewer). Quoted
 * delimiters count as cells too: a bound, never an undercount. One pass of
 * indexOf over the text.
 */
export function checkDataRows(data: string, delimiter: string, lineBreak: '\n' | '\r', firstLine: number): { problem: LimitProblem | null; lines: number } {
  let lines = 0;
  let start = 0;
  let next = data.indexOf(delimiter);
  while (start < data.length) {
    let stop = data.indexOf(lineBreak, start);
    if (stop < 0) stop = data.length;
    const line = firstLine + lines;
    if (++lines > MAX_ROWS) return { problem: { code: 'too_many_rows', rows: lines, line }, lines };
    let cells = 1;
    while (next >= 0 && next < stop) {
      if (++cells > MAX_COLUMNS) return { problem: { code: 'too_many_columns', line, columns: cells }, lines };
      next = data.indexOf(delimiter, next + 1);
    }
    start = stop + 1;
  }
  return { problem: null, lines };
}
