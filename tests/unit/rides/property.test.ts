// parseRide never throws: random bytes, mutated fixtures and random CSV-like
// grids all give a refusal with a known code or a summary that keeps the
// invariants of PRODUCT.md's definitions.

import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { roundTo } from '../../../src/lib/rides/metrics';
import { parseRide } from '../../../src/lib/rides/parse';
import type { ParsedRide, ParseOptions, RefusalCode, RideRefusal } from '../../../src/lib/rides/types';

const CODES: RefusalCode[] = ['empty_file', 'not_text', 'no_header', 'no_time_column', 'no_data_rows', 'no_measurements', 'too_large'];
const HALF_STEP = 0.05 + 1e-9;

function lineCount(bytes: Uint8Array): number {
  let lf = 0;
  let cr = 0;
  for (const b of bytes) {
    if (b === 10) lf++;
    else if (b === 13) cr++;
  }
  return Math.max(lf, cr) + 1;
}

function activeRange(values: Float64Array, r: ParsedRide): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  values.forEach((v, k) => {
    if (r.series.phase[k] === 'active' && Number.isFinite(v)) {
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
  });
  return lo <= hi ? [lo, hi] : null;
}

function within(value: number | null, values: Float64Array | undefined, r: ParsedRide, what: string) {
  if (value === null || values === undefined) return;
  const range = activeRange(values, r);
  expect(range, `${what} has a value but no active samples`).not.toBeNull();
  const [lo, hi] = range!;
  expect(value, what).toBeGreaterThanOrEqual(roundTo(lo, 1) - HALF_STEP);
  expect(value, what).toBeLessThanOrEqual(roundTo(hi, 1) + HALF_STEP);
}

function check(bytes: Uint8Array, result: ParsedRide | RideRefusal) {
  if (!result.ok) {
    expect(CODES).toContain(result.error.code);
    expect(result.error.message.length).toBeGreaterThan(0);
    if (result.error.line !== undefined) expect(Number.isInteger(result.error.line) && result.error.line >= 1).toBe(true);
    return;
  }
  const { summary: s, series } = result;
  const n = series.t.length;
  expect(s.samples).toBe(n);
  expect(series.phase.length).toBe(n);
  expect(n).toBeGreaterThan(0);
  expect(n).toBeLessThanOrEqual(lineCount(bytes) - result.metadata.headerLine);
  expect(series.t[0]).toBe(0);
  for (let k = 1; k < n; k++) expect(series.t[k]).toBeGreaterThan(series.t[k - 1]);

  for (const x of [s.durationS, s.activeS, s.passiveS, s.cooldownS]) expect(x).toBeGreaterThanOrEqual(0);
  expect(Math.abs(s.activeS + s.passiveS + s.cooldownS - s.durationS)).toBeLessThanOrEqual(0.2 + 1e-9);
  if (s.workKj !== null) expect(s.workKj).toBeGreaterThanOrEqual(0);
  within(s.meanPowerW, series.powerW, result, 'meanPowerW');
  within(s.peakPower5sW, series.powerW, result, 'peakPower5sW');
  within(s.meanCadenceRpm, series.cadenceRpm, result, 'meanCadenceRpm');
  within(s.pulseWidthUs, series.pulseWidthUs, result, 'pulseWidthUs');
  within(s.frequencyHz, series.frequencyHz, result, 'frequencyHz');
  for (const [name, c] of Object.entries(s.channels)) {
    const values = series.channels[name as keyof typeof series.channels]!;
    within(c!.meanCurrentMa, values, result, `${name}.meanCurrentMa`);
    const finite = [...values].filter(Number.isFinite);
    expect(c!.maxCurrentMa).toBe(finite.length ? roundTo(Math.max(...finite), 1) : null);
  }
  if (s.meanPowerW === null || s.meanPowerW < 0.45) expect(s.currentPerWattMaPerW).toBeNull();
  if (!series.distanceM && s.distanceM !== null) expect(s.distanceM).toBeGreaterThanOrEqual(0);
  for (const v of Object.values(s)) if (typeof v === 'number') expect(Number.isFinite(v)).toBe(true);
  expect(s.warnings.every((w) => typeof w === 'string' && w.length > 0)).toBe(true);
}

function run(bytes: Uint8Array, options?: ParseOptions) {
  check(bytes, parseRide(bytes, options));
}

const DIR = fileURLToPath(new URL('../../../fixtures/rides/', import.meta.url));
const fixtures = readdirSync(DIR)
  .filter((f) => f.endsWith('.csv'))
  .map((f) => new Uint8Array(readFileSync(DIR + f)));

const mutation = fc.record({
  kind: fc.constantFrom('flip', 'insert', 'delete', 'truncate', 'repeat'),
  at: fc.nat(),
  byte: fc.constantFrom(0, 9, 10, 13, 34, 44, 45, 46, 58, 59, 48, 49, 53, 57, 0xb5, 0xef, 0xff, 0x41, 32),
});

function mutate(bytes: Uint8Array, steps: { kind: string; at: number; byte: number }[]): Uint8Array {
  let b = Array.from(bytes);
  for (const m of steps) {
    const at = b.length === 0 ? 0 : m.at % b.length;
    if (m.kind === 'flip' && b.length > 0) b[at] = m.byte;
    else if (m.kind === 'insert') b.splice(at, 0, m.byte);
    else if (m.kind === 'delete') b.splice(at, 1);
    else if (m.kind === 'truncate') b = b.slice(0, at);
    else if (m.kind === 'repeat') b.splice(at, 0, ...b.slice(at, at + 40));
  }
  return Uint8Array.from(b);
}

const headerWord = fc.constantFrom(
  'Time (s)', 'time', 't_ms', 'Elapsed', 'timestamp', 'Phase', 'mode', 'Power (W)', 'power_kw', 'Watts', 'Cadence (rpm)', 'rpm',
  'Distance (km)', 'dist_mi', 'quad L', 'Hams_Right', 'glute lt', 'ch1', 'Channel 2 (A)', 'Pulse width (us)', 'pw [ms]', 'freq',
  'HR (bpm)', 'Notes', 'Temp (°C)', '', '"Power, mean (W)"', 'toString L', 'constructor',
);
const cell = fc.oneof(
  { weight: 6, arbitrary: fc.integer({ min: -50, max: 400 }).map(String) },
  { weight: 4, arbitrary: fc.double({ min: -5, max: 1500, noNaN: true }).map((x) => x.toFixed(2)) },
  { weight: 1, arbitrary: fc.constantFrom('', ' ', 'n/a', '-', 'Infinity', '1e400', '0x10', 'NaN', '∞') },
  { weight: 1, arbitrary: fc.constantFrom('passive', 'Warm-up', 'FES', 'cool down', 'pause', 'ACTIVE', 'stim', 'constructor', '__proto__') },
  { weight: 1, arbitrary: fc.tuple(fc.nat(99), fc.nat(59)).map(([m, s]) => `${m}:${String(s).padStart(2, '0')}`) },
  { weight: 1, arbitrary: fc.integer({ min: 0, max: 86399 }).map((s) => `2026-10-05T${new Date(s * 1000).toISOString().slice(11, 19)}${['Z', '+02:00', ''][s % 3]}`) },
  { weight: 1, arbitrary: fc.constantFrom('"a,b"', '"x""y"', '"line\nbreak"', '"unclosed', 'ü', '12,5') },
);
const grid = fc.record({
  preamble: fc.array(fc.constantFrom('Bench rig Z', 'Start time: 2026-10-05T09:30:00+02:00', 'Serial: Z-1', '', 'Device; Bench rig Z', 'Date: 2026-10-05', 'Time: 07:00'), { maxLength: 4 }),
  header: fc.array(headerWord, { minLength: 1, maxLength: 8 }),
  rows: fc.array(fc.array(cell, { maxLength: 9 }), { maxLength: 60 }),
  delimiter: fc.constantFrom(',', ';', '\t'),
  lineBreak: fc.constantFrom('\n', '\r\n', '\r'),
  timeFirst: fc.boolean(),
  bom: fc.boolean(),
  decimalComma: fc.boolean(),
});

function render(g: typeof grid extends fc.Arbitrary<infer T> ? T : never): Uint8Array {
  const header = g.timeFirst ? ['Time (s)', ...g.header] : g.header;
  const rows = g.rows.map((r, i) => (g.timeFirst ? [String(i % 7 === 3 ? i - 2 : i), ...r] : r));
  let text = [...g.preamble, header.join(g.delimiter), ...rows.map((r) => r.join(g.delimiter))].join(g.lineBreak);
  if (g.decimalComma && g.delimiter !== ',') text = text.replace(/(\d)\.(\d)/g, '$1,$2');
  const bytes = new TextEncoder().encode(text);
  return g.bom ? Uint8Array.from([0xef, 0xbb, 0xbf, ...bytes]) : bytes;
}

describe('parseRide on arbitrary input', () => {
  it('random bytes', () => {
    fc.assert(fc.property(fc.uint8Array({ maxLength: 3000 }), (b) => run(b)), { numRuns: 300 });
  });

  it('random bytes that look a little like text', () => {
    const texty = fc.array(fc.constantFrom(...'0123456789.,;:\t\n\r "-TimePowerCadence()Wsrpm'.split('')), { maxLength: 2000 }).map((cs) => new TextEncoder().encode(cs.join('')));
    fc.assert(fc.property(texty, (b) => run(b)), { numRuns: 300 });
  });

  it('mutated fixtures', () => {
    fc.assert(
      fc.property(fc.constantFrom(...fixtures), fc.array(mutation, { minLength: 1, maxLength: 12 }), (bytes, steps) => run(mutate(bytes, steps))),
      { numRuns: 400 },
    );
  });

  it('random CSV-like grids', () => {
    fc.assert(fc.property(grid, (g) => run(render(g))), { numRuns: 600 });
  });

  it('odd options', () => {
    const options = fc.record(
      {
        maxBytes: fc.constantFrom(0, -1, NaN, 10, 1e9),
        metresPerRev: fc.constantFrom(0, -2, NaN, Infinity, 1.5),
        timeZone: fc.constantFrom('Europe/Berlin', 'Not/AZone', '', 'UTC'),
        profile: fc.constantFrom<ParseOptions['profile']>(
          { name: 'p', columns: { Notes: { field: 'power', unit: 'parsecs' }, rpm: { field: 'time' } }, timeFormat: 'clock' },
          { name: 'q', columns: { Notes: { field: 'toString' }, constructor: { field: 'power' } }, timeFormat: 'constructor', metresPerRev: '2' } as unknown as ParseOptions['profile'],
          { name: 'r' } as unknown as ParseOptions['profile'],
        ),
      },
      { requiredKeys: [] },
    );
    fc.assert(fc.property(grid, options, (g, o) => run(render(g), o)), { numRuns: 300 });
  });
});
