import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { toCsv } from '../../../src/lib/exports/csv';

describe('CSV for spreadsheets', () => {
  it('starts with a UTF-8 byte-order mark and ends every line with CRLF', () => {
    const text = toCsv(['a', 'b'], [['Tomás', 1], ['x', null]]);
    expect(text.startsWith('\uFEFF')).toBe(true);
    expect(text.slice(1)).toBe('a,b\r\nTomás,1\r\nx,\r\n');
  });

  it('makes formulas inert as OWASP "CSV Injection" advises: a leading apostrophe on cells starting with = + - @ tab or CR', () => {
    // source: OWASP, "CSV Injection" (cells beginning with =, +, -, @, tab 0x09 or carriage return 0x0D;
    // prepend a single quote and quote the field).
    const nasty = ['=HYPERLINK("http://x","y")', '+1+1', '-2+3', '@SUM(1,2)', '\t=1', '\r=1', '=1+2\nsecond line'];
    const text = toCsv(['note'], nasty.map((n) => [n]));
    const rows: string[][] = parse(text, { bom: true, relax_quotes: false });
    expect(rows.slice(1).map((r) => r[0])).toEqual(nasty.map((n) => `'${n}`));
  });

  it('leaves numbers and harmless text alone, negative numbers included, and quotes what needs quoting', () => {
    const text = toCsv(['v', 'w'], [[-2.5, 'a, "b"'], [0, 'plain']]);
    const rows: string[][] = parse(text, { bom: true });
    expect(rows).toEqual([['v', 'w'], ['-2.5', 'a, "b"'], ['0', 'plain']]);
  });
});
