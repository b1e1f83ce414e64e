// Our CSV layer (papaparse as src/lib/rides/csv.ts calls it) against the
// RFC 4180 quoting cases of the csv-spectrum collection, with csv-parse as the
// reference tokeniser and csv-spectrum's own JSON as the expected records.
// source: RFC 4180 (Common Format and MIME Type for CSV Files), csv-spectrum 2.0.0, csv-parse 7

import { readdirSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { splitLine, tokenise } from '../../../src/lib/rides/csv';

const root = dirname(createRequire(import.meta.url).resolve('csv-spectrum/package.json'));
const cases = readdirSync(join(root, 'csvs'))
  .filter((f) => f.endsWith('.csv'))
  .map((f) => f.slice(0, -4))
  .sort();

// Kinloop skips empty lines, so both sides leave them out.
const withoutEmptyLines = (rows: string[][]) => rows.filter((r) => !(r.length === 1 && r[0] === ''));

describe('CSV tokenising against csv-spectrum (RFC 4180 cases)', () => {
  it('covers the quoting cases', () => {
    expect(cases).toEqual(expect.arrayContaining(['comma_in_quotes', 'escaped_quotes', 'newlines', 'newlines_crlf', 'quotes_and_newlines', 'empty_crlf']));
  });

  for (const name of cases) {
    it(`${name}: same rows as csv-parse and the same records as csv-spectrum's JSON`, () => {
      const text = readFileSync(join(root, 'csvs', `${name}.csv`), 'utf8');
      const ours = withoutEmptyLines(tokenise(text, ','));
      // relax_quotes: location_coordinates has a bare quote inside an unquoted field (inches, 37'37.8").
      const reference = parse(text, { skip_empty_lines: true, relax_column_count: true, relax_quotes: true }) as string[][];
      expect(ours).toEqual(reference);

      // A case with one record stores it as an object, not an array.
      const records = [JSON.parse(readFileSync(join(root, 'json', `${name}.json`), 'utf8'))].flat() as Record<string, string>[];
      const [header, ...body] = ours;
      const mapped = body.map((row) => Object.fromEntries(header.map((h, i) => [h, row[i]])));
      // csv-spectrum 2.0.0's location_coordinates.json has another phone number than its CSV; the cells that matter here are compared.
      if (name === 'location_coordinates') expect(mapped[0]['Location Coordinates']).toBe(records[0]['Location Coordinates']);
      else expect(mapped).toEqual(records);
    });
  }

  it('reads the same quoting with a semicolon delimiter', () => {
    const text = 'a;b\r\n1;"x;""y""\r\nz"\r\n';
    expect(withoutEmptyLines(tokenise(text, ';'))).toEqual(parse(text, { delimiter: ';' }));
  });

  it('splits one header line with quoted cells', () => {
    expect(splitLine('"Time (s)","Power (W, mean)",Cadence', ',')).toEqual(['Time (s)', 'Power (W, mean)', 'Cadence']);
  });
});
