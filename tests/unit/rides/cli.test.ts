// scripts/ride-summary.ts run as a user would: JSON on stdout, exit codes 0, 2, 64.

import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const ROOT = fileURLToPath(new URL('../../../', import.meta.url));
const FIXTURES = 'fixtures/rides/';

function cli(...args: string[]) {
  const r = spawnSync('npx', ['tsx', 'scripts/ride-summary.ts', ...args], { cwd: ROOT, encoding: 'utf8', timeout: 60_000 });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

// The field order of PRODUCT.md's metric table.
const FIELDS = [
  'startedAt', 'durationS', 'activeS', 'passiveS', 'cooldownS', 'meanPowerW', 'meanCadenceRpm', 'peakPower5sW', 'workKj',
  'distanceM', 'channels', 'currentPerWattMaPerW', 'pulseWidthUs', 'frequencyHz', 'enduranceRatioPct', 'samples', 'warnings',
];

describe('ride-summary CLI', { timeout: 60_000 }, () => {
  it('prints the summary of an accepted file with the fields in PRODUCT.md order and exits 0', () => {
    const r = cli(`${FIXTURES}comma-seconds.csv`);
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(Object.keys(out)).toEqual(FIELDS);
    const expected = JSON.parse(readFileSync(`${ROOT}${FIXTURES}comma-seconds.expected.json`, 'utf8'));
    expect(out.samples).toBe(expected.samples);
    expect(out.durationS).toBe(expected.durationS);
  });

  it('prints the error of a refused file and exits 2', () => {
    const r = cli(`${FIXTURES}refused-no-time-column.csv`);
    expect(r.status).toBe(2);
    const out = JSON.parse(r.stdout);
    expect(Object.keys(out)).toEqual(['error']);
    expect(Object.keys(out.error)).toEqual(['code', 'message', 'line']);
    expect(out.error).toMatchObject({ code: 'no_time_column', line: 2 });
  });

  it('applies --metres-per-rev to distance from cadence', () => {
    const plain = JSON.parse(cli(`${FIXTURES}no-phase-no-current.csv`).stdout);
    const r = cli(`${FIXTURES}no-phase-no-current.csv`, '--metres-per-rev', '3');
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).distanceM).toBeCloseTo(plain.distanceM * 1.5, 0);
  });

  it('answers bad usage on stderr with exit 64', () => {
    for (const args of [[], ['--metres-per-rev', 'abc', `${FIXTURES}comma-seconds.csv`], ['--verbose', `${FIXTURES}comma-seconds.csv`]]) {
      const r = cli(...args);
      expect(r.status, args.join(' ')).toBe(64);
      expect(r.stdout).toBe('');
      expect(r.stderr).toContain('usage: ride-summary');
    }
  });
});
