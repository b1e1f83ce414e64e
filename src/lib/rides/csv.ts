// The CSV tokenising layer: papaparse splits text into rows of cells (RFC 4180
// quoting); everything after that is Kinloop's.

import Papa from 'papaparse';

export type Delimiter = ',' | ';' | '\t';
export const DELIMITERS: readonly Delimiter[] = [',', ';', '\t'];

/** The line break of a text: "\n" (also for CRLF), or "\r" for files that use lone CRs. */
export function lineBreakOf(text: string): '\n' | '\r' {
  return text.includes('\n') || !text.includes('\r') ? '\n' : '\r';
}

// Without quotes, splitting at "\n" reads CRLF and mixed files alike (the CR
// left on each row's last cell is cut off afterwards). With quotes the parser
// must see the real line break so that "…"\r\n closes a field.
export function papaNewline(text: string, lineBreak: '\n' | '\r'): '\n' | '\r' | '\r\n' {
  if (lineBreak === '\r' || !text.includes('"')) return lineBreak;
  const i = text.indexOf('\n');
  return i > 0 && text.charCodeAt(i - 1) === 13 ? '\r\n' : '\n';
}

/** All rows of a text, one per line (an empty line gives [""]), quoted fields unquoted. */
export function tokenise(text: string, delimiter: Delimiter, lineBreak: '\n' | '\r' = lineBreakOf(text)): string[][] {
  if (text === '') return [];
  const rows = Papa.parse<string[]>(text, {
    delimiter,
    newline: papaNewline(text, lineBreak),
    header: false,
    skipEmptyLines: false,
  }).data;
  const last = rows[rows.length - 1];
  if (last !== undefined && last.length === 1 && last[0] === '') rows.pop();
  if (lineBreak === '\n' && text.includes('\r')) {
    for (const row of rows) {
      const end = row.length - 1;
      if (row[end].endsWith('\r')) row[end] = row[end].slice(0, -1);
    }
  }
  return rows;
}

/** The cells of one line. */
export function splitLine(line: string, delimiter: Delimiter): string[] {
  if (!line.includes('"')) return line.split(delimiter);
  return tokenise(line, delimiter, '\n')[0] ?? [''];
}
