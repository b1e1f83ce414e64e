// Every fixture in fixtures/rides/ parsed and compared with the summary that
// fixtures/rides/expected/compute_expected.py (an independent Python
// implementation of PRODUCT.md's rules) wrote beside it.

import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { DECIMALS } from '../../../src/lib/rides/metrics';
import { parseRide } from '../../../src/lib/rides/parse';
import type { ParseOptions, RideSummary } from '../../../src/lib/rides/types';

const DIR = fileURLToPath(new URL('../../../fixtures/rides/', import.meta.url));
const names = readdirSync(DIR)
  .filter((f) => f.endsWith('.csv'))
  .map((f) => f.slice(0, -4))
  .sort();

const json = (file: string) => JSON.parse(readFileSync(DIR + file, 'utf8'));
const optionsOf = (name: string): ParseOptions => (existsSync(`${DIR}${name}.options.json`) ? json(`${name}.options.json`) : {});

// Both sides round to the same decimals; one rounding step absorbs a value that
// lies on a rounding boundary and lands on different sides in the two implementations.
const STEP: Record<string, number> = {
  durationS: 10 ** -DECIMALS.seconds,
  activeS: 10 ** -DECIMALS.seconds,
  passiveS: 10 ** -DECIMALS.seconds,
  cooldownS: 10 ** -DECIMALS.seconds,
  meanPowerW: 10 ** -DECIMALS.watts,
  peakPower5sW: 10 ** -DECIMALS.watts,
  meanCadenceRpm: 10 ** -DECIMALS.rpm,
  workKj: 10 ** -DECIMALS.kilojoules,
  distanceM: 10 ** -DECIMALS.metres,
  currentPerWattMaPerW: 10 ** -DECIMALS.milliamperesPerWatt,
  pulseWidthUs: 10 ** -DECIMALS.microseconds,
  frequencyHz: 10 ** -DECIMALS.hertz,
  meanCurrentMa: 10 ** -DECIMALS.milliamperes,
  maxCurrentMa: 10 ** -DECIMALS.milliamperes,
};

function close(actual: number | null, expected: number | null, step: number, what: string) {
  if (expected === null) {
    expect(actual, what).toBeNull();
    return;
  }
  expect(actual, what).not.toBeNull();
  expect(Math.abs((actual as number) - expected), `${what}: ${actual} vs ${expected}`).toBeLessThanOrEqual(step + 1e-9);
}

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
      for (const key of Object.keys(STEP)) {
        if (key in e) close(s[key as keyof RideSummary] as number | null, e[key as keyof RideSummary] as number | null, STEP[key], key);
      }
      expect(Object.keys(s.channels).sort()).toEqual(Object.keys(e.channels).sort());
      for (const [channel, c] of Object.entries(e.channels)) {
        const got = s.channels[channel as keyof typeof s.channels]!;
        close(got.meanCurrentMa, c!.meanCurrentMa, STEP.meanCurrentMa, `${channel}.meanCurrentMa`);
        close(got.maxCurrentMa, c!.maxCurrentMa, STEP.maxCurrentMa, `${channel}.maxCurrentMa`);
      }
      // Same warnings, in any order: both implementations word them alike.
      expect([...s.warnings].sort()).toEqual([...e.warnings].sort());
    });
  }
});
