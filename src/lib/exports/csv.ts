// CSV files for spreadsheets: UTF-8 with a byte-order mark (so Excel reads the
// accents), CRLF line ends, and every text cell that a spreadsheet would run as
// a formula made inert (OWASP "CSV Injection").
import Papa from 'papaparse';

/**
 * Text cells starting with =, +, -, @, tab or carriage return get a leading
 * apostrophe. Papaparse's own `escapeFormulae: true` pattern ends in `.*$`
 * without the s flag, so a cell with a line break after the formula would
 * slip through; this one only looks at the first character.
 */
export const FORMULA_START = /^[=+\-@\t\r]/;

export type CsvCell = string | number | null;

export function toCsv(header: string[], rows: CsvCell[][]): string {
  return (
    '\uFEFF' +
    Papa.unparse(
      { fields: header, data: rows.map((r) => r.map((c) => (c === null ? '' : c))) },
      { newline: '\r\n', escapeFormulae: FORMULA_START, quotes: false },
    ) +
    '\r\n'
  );
}
