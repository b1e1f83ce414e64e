// parseRide never throws: random bytes, mutated fixtures and random CSV-like
// grids all give a refusal with a known code or a summary that keeps the
// invariants of PRODUCT.md's definitions.

import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { roundTo } from '../../../src/lib/analytics/round';
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

/**
 * Δ per PRODUCT.md, worked out here on its own: the step to the next sample,
 * 0 for a step over 10 s (a pause), the median of all raw steps for the last.
 */
function deltasOf(t: Float64Array): number[] {
  const raw = Array.from({ length: t.length - 1 }, (_, k) => t[k + 1] - t[k]);
  const sorted = [...raw].sort((a, b) => a - b);
  const mid = sorted.length / 2;
  const median = sorted.length === 0 ? 0 : sorted.length % 2 ? sorted[Math.floor(mid)] : (sorted[mid - 1] + sorted[mid]) / 2;
  return [...raw.map((d) => (d > 10 + 1e-6 ? 0 : d)), median];
}

/** The Δ that the active samples with a value of this column weigh. */
function activeWeight(values: Float64Array, r: ParsedRide): number {
  const d = deltasOf(r.series.t);
  let w = 0;
  values.forEach((v, k) => {
    if (r.series.phase[k] === 'active' && Number.isFinite(v)) w += d[k];
  });
  return w;
}

type Kind = 'mean' | 'median' | 'peak';

/**
 * A summary number lies within its column's active values (to the rounding);
 * it is null exactly when nothing could give it: no column, or active values
 * that weigh nothing (a time-weighted mean), or none at all (a median). A 5-s
 * peak may be null with values, but not with a value and under 5 s of them.
 */
function within(value: number | null, values: Float64Array | undefined, r: ParsedRide, what: string, kind: Kind) {
  if (values === undefined) {
    expect(value, `${what} without its column`).toBeNull();
    return;
  }
  const range = activeRange(values, r);
  const weight = activeWeight(values, r);
  if (value === null) {
    if (kind === 'mean') expect(weight, `${what} is null though active values weigh ${weight} s`).toBeLessThanOrEqual(1e-9);
    if (kind === 'median') expect(range, `${what} is null though there are active values`).toBeNull();
    return;
  }
  expect(range, `${what} has a value but no active samples`).not.toBeNull();
  if (kind === 'peak') expect(weight, `${what} with under 5 s of active values`).toBeGreaterThanOrEqual(5 - 1e-6);
  const [lo, hi] = range!;
  expect(value, what).toBeGreaterThanOrEqual(roundTo(lo, 1) - HALF_STEP);
  expect(value, what).toBeLessThanOrEqual(roundTo(hi, 1) + HALF_STEP);
}

/** Checks a parse; true when the file was accepted (and its summary checked). */
function check(bytes: Uint8Array, result: ParsedRide | RideRefusal): boolean {
  if (!result.ok) {
    expect(CODES).toContain(result.error.code);
    expect(result.error.message.length).toBeGreaterThan(0);
    if (result.error.line !== undefined) expect(Number.isInteger(result.error.line) && result.error.line >= 1).toBe(true);
    return false;
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
  within(s.meanPowerW, series.powerW, result, 'meanPowerW', 'mean');
  within(s.peakPower5sW, series.powerW, result, 'peakPower5sW', 'peak');
  within(s.meanCadenceRpm, series.cadenceRpm, result, 'meanCadenceRpm', 'mean');
  within(s.pulseWidthUs, series.pulseWidthUs, result, 'pulseWidthUs', 'median');
  within(s.frequencyHz, series.frequencyHz, result, 'frequencyHz', 'median');
  expect(Object.keys(s.channels).sort()).toEqual(Object.keys(series.channels).sort());
  for (const [name, c] of Object.entries(s.channels)) {
    const values = series.channels[name as keyof typeof series.channels]!;
    within(c!.meanCurrentMa, values, result, `${name}.meanCurrentMa`, 'mean');
    const finite = [...values].filter(Number.isFinite);
    expect(c!.maxCurrentMa).toBe(finite.length ? roundTo(Math.max(...finite), 1) : null);
  }
  if (s.meanPowerW === null || s.meanPowerW < 0.45) expect(s.currentPerWattMaPerW).toBeNull();
  if (!series.distanceM && s.distanceM !== null) expect(s.distanceM).toBeGreaterThanOrEqual(0);
  for (const v of Object.values(s)) if (typeof v === 'number') expect(Number.isFinite(v)).toBe(true);
  expect(s.warnings.every((w) => typeof w === 'string' && w.length > 0)).toBe(true);
  return true;
}

/** Runs a property and returns the share of its inputs that were accepted, so a test can show it reached the summary checks. */
function acceptedShare<T>(arb: fc.Arbitrary<T>, parse: (value: T) => boolean, numRuns: number): number {
  let accepted = 0;
  fc.assert(
    fc.property(arb, (value) => {
      if (parse(value)) accepted++;
    }),
    { numRuns },
  );
  return accepted / numRuns;
}

function run(bytes: Uint8Array, options?: ParseOptions): boolean {
  return check(bytes, parseRide(bytes, options));
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

/** A small valid ride file: a header and `rows` rows of plausible values. */
function validRide(rows: number): string {
  const lines = ['Time (s),Phase,Power (W),Cadence (rpm),Quad L (mA),Pulse width (us),Freq (Hz)'];
  for (let i = 0; i < rows; i++) lines.push(`${i},${i < 3 ? 'passive' : 'active'},${10 + (i % 7)},${40 + (i % 3)},${50 + (i % 5)},300,35`);
  return lines.join('\n') + '\n';
}

// Heavier than most unit tests (thousands of parses); the budget leaves room for a busy machine.
const BUDGET_MS = 60_000;

describe('parseRide on arbitrary input', () => {
  it('random bytes are refused with a known code, never thrown', () => {
    let refused = 0;
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 3000 }), (b) => {
        if (!run(b)) refused++;
      }),
      { numRuns: 300 },
    );
    // Binary noise is not a ride file.
    expect(refused).toBeGreaterThanOrEqual(295);
  });

  it(
    'random bytes spliced into a valid ride file',
    () => {
      const base = new TextEncoder().encode(validRide(40));
      const splice = fc.record({ at: fc.nat(), bytes: fc.uint8Array({ minLength: 1, maxLength: 6 }) });
      const share = acceptedShare(
        fc.array(splice, { minLength: 1, maxLength: 4 }),
        (splices) => {
          let b = Array.from(base);
          for (const sp of splices) b.splice(sp.at % (b.length + 1), 0, ...sp.bytes);
          return run(Uint8Array.from(b));
        },
        300,
      );
      expect(share).toBeGreaterThan(0.5);
    },
    BUDGET_MS,
  );

  it(
    'random text-like characters in the cells of a ride file, with or without its header',
    () => {
      const chars = fc.constantFrom(...'0123456789.,;:\t "-TimePowerCadence()Wsrpm'.split(''));
      const noise = fc.array(chars, { maxLength: 30 }).map((cs) => cs.join(''));
      const number = fc.double({ min: -20, max: 200, noNaN: true }).map((x) => x.toFixed(1));
      const cell = fc.oneof({ weight: 3, arbitrary: number }, { weight: 1, arbitrary: noise });
      const file = fc.record({
        delimiter: fc.constantFrom(',', ';', '\t'),
        header: fc.constantFrom(true, true, true, false),
        rows: fc.array(fc.tuple(cell, cell, fc.option(noise, { nil: undefined })), { minLength: 1, maxLength: 60 }),
        eol: fc.constantFrom('\n', '\r\n', '\r'),
      });
      const share = acceptedShare(
        file,
        (f) => {
          const d = f.delimiter;
          const lines = f.rows.map(([a, b, extra], i) => [String(i), a, b, ...(extra === undefined ? [] : [extra])].join(d));
          return run(new TextEncoder().encode([...(f.header ? [['Time (s)', 'Power (W)', 'Cadence (rpm)'].join(d)] : []), ...lines].join(f.eol)));
        },
        300,
      );
      expect(share).toBeGreaterThan(0.3);
    },
    BUDGET_MS,
  );

  it(
    'mutated fixtures',
    () => {
      const share = acceptedShare(fc.tuple(fc.constantFrom(...fixtures), fc.array(mutation, { minLength: 1, maxLength: 12 })), ([bytes, steps]) => run(mutate(bytes, steps)), 400);
      expect(share).toBeGreaterThan(0.3);
    },
    BUDGET_MS,
  );

  it(
    'random CSV-like grids',
    () => {
      const share = acceptedShare(grid, (g) => run(render(g)), 600);
      expect(share).toBeGreaterThan(0.2);
    },
    BUDGET_MS,
  );

  it(
    'odd options',
    () => {
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
      const share = acceptedShare(fc.tuple(grid, options), ([g, o]) => run(render(g), o), 300);
      expect(share).toBeGreaterThan(0.1);
    },
    BUDGET_MS,
  );
});
