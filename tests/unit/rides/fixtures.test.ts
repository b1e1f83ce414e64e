// Every fixture in fixtures/rides/ parsed and compared with the summary that
// fixtures/rides/expected/compute_expected.py (an independent Python
// implementation of PRODUCT.md's rules) wrote beside it.

import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseRide } from '../../../src/lib/rides/parse';
import type { ParseOptions, RideSummary } from '../../../src/lib/rides/types';

const DIR = fileURLToPath(new URL('../../../fixtures/rides/', import.meta.url));
const names = readdirSync(DIR)
  .filter((f) => f.endsWith('.csv'))
  .map((f) => f.slice(0, -4))
  .sort();

const json = (file: string) => JSON.parse(readFileSync(DIR + file, 'utf8'));
const optionsOf = (name: string): ParseOptions => (existsSync(`${DIR}${name}.options.json`) ? json(`${name}.options.json`) : {});

// Both sides round as DEVELOPERS.md states (half away from zero; seconds, W,
// rpm, m, mA, µs, Hz and % to 0.1; kJ and mA/W to 0.001), so the numbers must be
// equal, not merely close: a change of the rounding rule or of a field's
// decimals shows here.
const NUMBERS = [
  'durationS',
  'activeS',
  'passiveS',
  'cooldownS',
  'meanPowerW',
  'peakPower5sW',
  'meanCadenceRpm',
  'workKj',
  'distanceM',
  'currentPerWattMaPerW',
  'pulseWidthUs',
  'frequencyHz',
  'enduranceRatioPct',
] as const;

describe('ride-file fixtures against independently computed expectations', () => {
  it('has at least twelve accepted fixtures and one refused fixture per refusal code', () => {
    const expected = names.map((n) => json(`${n}.expected.json`));
    expect(expected.filter((e) => !('error' in e)).length).toBeGreaterThanOrEqual(12);
    const codes = new Set(expected.filter((e) => 'error' in e).map((e) => e.error.code));
    expect([...codes].sort()).toEqual(['empty_file', 'no_data_rows', 'no_header', 'no_measurements', 'no_time_column', 'not_text', 'too_large']);
  });

  for (const name of names) {
    it(name, () => {
      const expected = json(`${name}.expected.json`);
      const result = parseRide(readFileSync(`${DIR}${name}.csv`), optionsOf(name));
      if ('error' in expected) {
        expect(result.ok).toBe(false);
        if (result.ok) return;
        expect(result.error.code).toBe(expected.error.code);
        expect(result.error.line).toBe(expected.error.line);
        expect(result.error.message.length).toBeGreaterThan(20);
        return;
      }
      expect(result.ok, JSON.stringify(!result.ok && result.error)).toBe(true);
      if (!result.ok) return;
      const s: RideSummary = result.summary;
      const e = expected as RideSummary;
      expect(Object.keys(s).sort()).toEqual(Object.keys(e).sort());
      expect(s.startedAt).toBe(e.startedAt);
      expect(s.samples).toBe(e.samples);
      for (const key of NUMBERS) expect(s[key], key).toBe(e[key]);
      expect(s.channels).toEqual(e.channels);
      // Same warnings, in any order: both implementations word them alike.
      expect([...s.warnings].sort()).toEqual([...e.warnings].sort());
    });
  }
});
