// Encodings, delimiters, preambles and refusal messages, on the fixtures whose
// layout fixtures/rides/make_fixtures.py wrote on purpose.

import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { looksLikeText } from '../../../src/lib/rides/decode';
import { parseRide } from '../../../src/lib/rides/parse';
import type { ParseOptions } from '../../../src/lib/rides/types';

const DIR = fileURLToPath(new URL('../../../fixtures/rides/', import.meta.url));
const fixture = (name: string, options?: ParseOptions) => parseRide(readFileSync(`${DIR}${name}.csv`), options);
const file = (text: string) => new TextEncoder().encode(text);

describe('layout of the fixtures', () => {
  const cases: [string, { encoding: string; delimiter: string; decimalComma: boolean; headerLine: number; deviceSerial: string | null; deviceName: string | null }][] = [
    ['comma-seconds', { encoding: 'utf-8', delimiter: ',', decimalComma: false, headerLine: 1, deviceSerial: null, deviceName: null }],
    ['semicolon-decimal-comma', { encoding: 'utf-8', delimiter: ';', decimalComma: true, headerLine: 6, deviceSerial: 'BRA-000123', deviceName: 'Bench rig A' }],
    ['tab-bom-ms-kw-amps', { encoding: 'utf-8-bom', delimiter: '\t', decimalComma: false, headerLine: 1, deviceSerial: null, deviceName: null }],
    ['utf16le-hms', { encoding: 'utf-16le', delimiter: ',', decimalComma: false, headerLine: 4, deviceSerial: 'BRB-7', deviceName: 'Bench rig B' }],
    ['windows1252-iso', { encoding: 'windows-1252', delimiter: ';', decimalComma: false, headerLine: 4, deviceSerial: null, deviceName: 'Bench rig C' }],
    ['crlf-metadata-timezone', { encoding: 'utf-8', delimiter: ',', decimalComma: false, headerLine: 6, deviceSerial: 'BRD-0099', deviceName: 'Bench rig D' }],
  ];
  for (const [name, want] of cases) {
    it(name, () => {
      const r = fixture(name);
      expect(r.ok).toBe(true);
      if (!r.ok) return;
      const { encoding, delimiter, decimalComma, headerLine, deviceSerial, deviceName } = r.metadata;
      expect({ encoding, delimiter, decimalComma, headerLine, deviceSerial, deviceName }).toEqual(want);
    });
  }

  it('decodes Windows-1252 headers and titles', () => {
    const r = fixture('windows1252-iso');
    expect(r.ok && r.metadata.columns.map((c) => c.header)).toContain('Pulse width (µs)');
    expect(r.ok && r.metadata.columns.find((c) => c.header === 'Temp (°C)')?.field).toBeNull();
  });

  it('keeps the preamble entries as written', () => {
    const r = fixture('semicolon-decimal-comma');
    expect(r.ok && r.metadata.preamble).toEqual({ 'Start time': '2026-10-05T09:30:00+02:00', 'Serial number': 'BRA-000123', Device: 'Bench rig A' });
  });

  it('reads the same ride from UTF-16 big-endian with BOM', () => {
    const text = 'Time (s),Power (W)\n0,10\n1,12\n';
    const be = new Uint8Array(2 + text.length * 2);
    be.set([0xfe, 0xff]);
    for (let i = 0; i < text.length; i++) be.set([0, text.charCodeAt(i)], 2 + 2 * i);
    const r = parseRide(be);
    expect(r.ok && [r.metadata.encoding, r.summary.meanPowerW]).toEqual(['utf-16be', 11]);
  });

  it('needs the import profile for a device with its own words', () => {
    const profiled = JSON.parse(readFileSync(`${DIR}profile-clock.options.json`, 'utf8')) as ParseOptions;
    expect(fixture('profile-clock', profiled).ok).toBe(true);
    const plain = fixture('profile-clock');
    expect(!plain.ok && plain.error.code).toBe('no_header');
  });
});

describe('refusals', () => {
  it('says what, where and what to do', () => {
    const r = fixture('refused-no-time-column');
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.error).toMatchObject({ code: 'no_time_column', line: 2 });
    expect(r.error.message).toContain('Line 2 names measurement columns (Power (W), Cadence (rpm)) but no time column');
    expect(r.error.message).toContain('import profile');
  });

  it('refuses by size before reading anything', () => {
    const r = parseRide(new Uint8Array(100), { maxBytes: 64 });
    expect(!r.ok && r.error.code).toBe('too_large');
  });

  it('treats NULs and many control characters as binary, not text', () => {
    expect(looksLikeText('Time,Power\n0,1\n')).toBe(true);
    expect(looksLikeText('Time,Power\u0000\n')).toBe(false);
    expect(looksLikeText('\u0001\u0002\u0003 mostly binary')).toBe(false);
    const utf16WithoutBom = new Uint8Array([...'Time,Power\n'].flatMap((c) => [c.charCodeAt(0), 0]));
    expect(!parseRide(utf16WithoutBom).ok && (parseRide(utf16WithoutBom) as { error: { code: string } }).error.code).toBe('not_text');
  });

  it('names the header line when no row has a readable time', () => {
    const r = parseRide(file('Title\nTime (s),Power (W)\nstart,10\nend,11\n'));
    expect(!r.ok && r.error).toMatchObject({ code: 'no_data_rows', line: 2 });
  });
});
