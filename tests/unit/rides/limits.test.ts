// The parser's limits (DEVELOPERS.md, "Limits of one ride file"): each one
// refuses with its own code and the line it concerns, and a file just inside
// each limit is still read. The numbers below are the documented limits,
// written out here rather than read from the module.
import { describe, expect, it } from 'vitest';
import { parseRide } from '../../../src/lib/rides/parse';
import type { ImportProfile } from '../../../src/lib/rides/types';

const bytes = (s: string) => new TextEncoder().encode(s);
const HEADER = 'time,power\n';

function refusal(text: string, profile?: ImportProfile) {
  const r = parseRide(bytes(text), { profile });
  if (r.ok) throw new Error('expected a refusal');
  return r.error;
}

function accepted(text: string, profile?: ImportProfile) {
  const r = parseRide(bytes(text), { profile });
  if (!r.ok) throw new Error(`expected the file to be read: ${r.error.code} ${r.error.message}`);
  return r;
}

describe('line length: at most 16,384 characters', () => {
  it('refuses a longer line with line_too_long and its line number', () => {
    const text = `Title\n${HEADER}${'0,1 '.padEnd(16_385, ' ')}\n1,2\n`;
    const error = refusal(text);
    expect(error.code).toBe('line_too_long');
    expect(error.line).toBe(3);
    expect(error.message).toContain('16,385 characters');
  });

  it('reads a file whose preamble has a line of exactly 16,384 characters', () => {
    const r = accepted(`${'x'.repeat(16_384)}\n${HEADER}0,1\n1,2\n`);
    expect(r.summary.samples).toBe(2);
  });

  it('refuses a file with no line break at all, however short its first line', () => {
    expect(refusal(`${HEADER}${'7'.repeat(100_000)}`).code).toBe('line_too_long');
  });
});

describe('columns: at most 200 cells in a row', () => {
  it('refuses a data row with 201 cells, naming its line', () => {
    const wide = `0,1${',9'.repeat(199)}`; // 2 + 199 = 201 cells
    const error = refusal(`${HEADER}1,2\n2,3\n3,4\n${wide}\n`);
    expect(error.code).toBe('too_many_columns');
    expect(error.line).toBe(5);
  });

  it('reads data rows of exactly 200 cells', () => {
    const row = (t: number) => `${t},1${',9'.repeat(198)}`;
    expect(accepted(`${HEADER}${row(0)}\n${row(1)}\n`).summary.samples).toBe(2);
  });

  it('says too_many_columns, not no_header, when the only candidate for a header is too wide', () => {
    const header = ['time', 'power', ...Array.from({ length: 250 }, (_, i) => `extra ${i}`)].join(',');
    const error = refusal(`${header}\n0,1\n`);
    expect(error.code).toBe('too_many_columns');
    expect(error.line).toBe(1);
  });
});

describe('rows: at most 500,000 lines after the header', () => {
  it('refuses line 500,001 after the header with too_many_rows', { timeout: 60_000 }, () => {
    const rows = Array.from({ length: 500_001 }, (_, i) => `${i},1`).join('\n');
    const error = refusal(`${HEADER}${rows}\n`);
    expect(error.code).toBe('too_many_rows');
    // The header is line 1, so the 500,001st line after it is line 500,002.
    expect(error.line).toBe(500_002);
  });

  it('reads 500,000 rows', { timeout: 60_000 }, () => {
    const rows = Array.from({ length: 500_000 }, (_, i) => `${i},1`).join('\n');
    expect(accepted(`${HEADER}${rows}\n`).summary.samples).toBe(500_000);
  });
});

describe('header search: the first 1,000 lines or 64 KiB', () => {
  const preamble = (lines: number) => Array.from({ length: lines }, (_, i) => `Note ${String(i).padStart(4, '0')}: ${'-'.repeat(989)}`).join('\n') + '\n';

  it('finds a header after 60 KiB of preamble', () => {
    // 60 lines of 1,000 characters and a line break: 60,060 characters before the header.
    expect(accepted(`${preamble(60)}${HEADER}0,1\n1,2\n`).metadata.headerLine).toBe(61);
  });

  it('stops looking after 64 KiB and says how many lines it searched', () => {
    // 65,536 / 1,001 characters per line: lines 1–66 start before the 64 KiB mark, line 67 after it.
    const error = refusal(`${preamble(80)}${HEADER}0,1\n`);
    expect(error.code).toBe('no_header');
    expect(error.message).toContain('first 66 lines');
  });
});

describe('import profiles', () => {
  it('uses the first profile entry that matches a header, with or without its unit', () => {
    const profile: ImportProfile = {
      name: 'two matches',
      columns: { 'Output': { field: 'power', unit: 'kW' }, 'Output (W)': { field: 'power', unit: 'W' }, 'Secs': { field: 'time' } },
    };
    const r = accepted('Secs,Output (W)\n0,0.02\n1,0.02\n', profile);
    // "Output" comes first in the profile and says kW: 0.02 kW is 20 W.
    expect(r.summary.meanPowerW).toBe(20);
  });
});
