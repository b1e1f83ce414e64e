// The header table of PRODUCT.md ("Canonical ride metrics"), word by word.

import { describe, expect, it } from 'vitest';
import { readHeaderCell, readHeaderRow } from '../../../src/lib/rides/headers';
import type { ImportProfile } from '../../../src/lib/rides/types';

const read = (h: string, profile?: ImportProfile) => {
  const r = readHeaderCell(h, profile);
  return [r.field, r.unit?.symbol ?? null];
};

describe('header words', () => {
  const table: [string, string][] = [
    ['time', 'time'], ['Elapsed', 'time'], ['elapsed time', 'time'], ['t', 'time'], ['Seconds', 'time'], ['sec', 'time'], ['TIMESTAMP', 'time'],
    ['phase', 'phase'], ['Mode', 'phase'], ['stage', 'phase'], ['segment', 'phase'],
    ['cadence', 'cadence'], ['RPM', 'cadence'], ['crank rpm', 'cadence'], ['pedal-rate', 'cadence'],
    ['power', 'power'], ['Watts', 'power'], ['power output', 'power'], ['output', 'power'],
    ['distance', 'distance'], ['dist', 'distance'],
    ['pulse width', 'pulse_width'], ['PW', 'pulse_width'], ['pulse_width', 'pulse_width'],
    ['frequency', 'frequency'], ['freq', 'frequency'], ['stim frequency', 'frequency'],
    ['heart rate', 'heart_rate'], ['HR', 'heart_rate'], ['Pulse (bpm)', 'heart_rate'],
  ];
  for (const [header, field] of table) it(`"${header}" → ${field}`, () => expect(readHeaderCell(header).field).toBe(field));

  it('takes the unit from (W), [W] or _w and applies defaults', () => {
    expect(read('Power (W)')).toEqual(['power', 'W']);
    expect(read('Power [kW]')).toEqual(['power', 'kW']);
    expect(read('power_kw')).toEqual(['power', 'kW']);
    expect(read('PowerKW')).toEqual(['power', 'kW']);
    expect(read('Power')).toEqual(['power', 'W']);
    expect(read('Time_ms')).toEqual(['time', 'ms']);
    expect(read('Distance (km)')).toEqual(['distance', 'km']);
    expect(read('dist_mi')).toEqual(['distance', 'mi']);
    expect(read('Pulse width (µs)')).toEqual(['pulse_width', 'µs']);
    expect(read('pw [ms]')).toEqual(['pulse_width', 'ms']);
    expect(read('Time (mm:ss)')).toEqual(['time', 's']);
  });

  it('reads channel currents in many spellings', () => {
    const spellings: [string, string, string][] = [
      ['quad L', 'quadriceps_left', 'mA'],
      ['QuadR', 'quadriceps_right', 'mA'],
      ['Quadriceps left current (mA)', 'quadriceps_left', 'mA'],
      ['Hams_Right', 'hamstrings_right', 'mA'],
      ['left hamstring amplitude', 'hamstrings_left', 'mA'],
      ['ham lt', 'hamstrings_left', 'mA'],
      ['glute lt', 'gluteals_left', 'mA'],
      ['Gluteus RT stim', 'gluteals_right', 'mA'],
      ['glutes_r_a', 'gluteals_right', 'A'],
      ['ch1', 'channel_1', 'mA'],
      ['Ch 8 (A)', 'channel_8', 'A'],
      ['channel 3 current', 'channel_3', 'mA'],
    ];
    for (const [h, field, unit] of spellings) expect(read(h), h).toEqual([field, unit]);
  });

  it('ignores words outside the table', () => {
    for (const h of ['ch9', 'quad', 'left', 'quad left right', 'power avg', 'Notes', 'Temp (°C)', '']) expect(readHeaderCell(h).field, h).toBeNull();
  });

  it('is not fooled by words that name JavaScript object properties', () => {
    for (const h of ['constructor L', 'toString', '__proto__ right', 'hasOwnProperty']) expect(readHeaderCell(h).field, h).toBeNull();
  });

  it('leaves out import-profile entries that do not name a Kinloop field', () => {
    const profile = { name: 'broken', columns: { Effort: { field: 'constructor' }, Speed: { field: 42 }, Clock: null } } as unknown as ImportProfile;
    expect(readHeaderCell('Effort', profile).problem).toContain('"constructor", which is not a Kinloop field');
    expect(readHeaderCell('Speed', profile).field).toBeNull();
    expect(readHeaderCell('Clock', profile).field).toBeNull();
  });

  it('refuses a known word with a unit it does not read', () => {
    const r = readHeaderCell('Cadence (Hz)');
    expect(r.field).toBeNull();
    expect(r.problem).toContain('"Hz" is not one Kinloop reads for cadence');
  });

  it('uses the first of two columns for one field', () => {
    const row = readHeaderRow(['Time', 'Power (W)', 'Watts']);
    expect(row.map((r) => r.field)).toEqual(['time', 'power', null]);
    expect(row[2].problem).toContain('only the first such column ("Power (W)")');
  });

  it('maps other header words through an import profile, ignoring case and punctuation', () => {
    const profile: ImportProfile = {
      name: 'Bench rig E',
      columns: { 'Crank speed': { field: 'cadence' }, effort: { field: 'power' }, 'STIM-A': { field: 'quadriceps_left', unit: 'A' }, Watts: { field: 'heart_rate' } },
    };
    expect(read('crank_speed', profile)).toEqual(['cadence', 'rpm']);
    expect(read('Effort (kW)', profile)).toEqual(['power', 'kW']);
    expect(read('Stim A', profile)).toEqual(['quadriceps_left', 'A']);
    expect(read('Watts', profile)).toEqual(['heart_rate', 'bpm']);
  });
});
