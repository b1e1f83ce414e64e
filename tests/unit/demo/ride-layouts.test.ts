// The demo cycles' ride files (invented layouts and numbers) read back through
// Kinloop's parser without an import profile, with the summary the spec asked for.
import { describe, expect, it } from 'vitest';
import { generateRide, type RideSpec } from '../../../src/lib/demo/ride-generator';
import { RIDE_LAYOUTS, type LayoutKey } from '../../../src/lib/demo/ride-layouts';
import { parseRide } from '../../../src/lib/rides/parse';
import type { ParsedRide } from '../../../src/lib/rides/types';

const SPEC: RideSpec = {
  startedAt: '2026-10-05T09:30:00+01:00',
  warmupMin: 5,
  activeMin: 32,
  cooldownMin: 4,
  meanPowerW: 18.4,
  cadenceRpm: 44,
  currents: { quadriceps_left: 80, quadriceps_right: 78, hamstrings_left: 70, hamstrings_right: 71, gluteals_left: 60, gluteals_right: 62 },
  pulseWidthUs: 300,
  frequencyHz: 35,
  hz: 1,
  deviceSerial: 'KBA-1234',
};

function parsed(layout: LayoutKey, spec: RideSpec, seed = 5): ParsedRide {
  const result = parseRide(RIDE_LAYOUTS[layout].write(generateRide(spec, seed)));
  if (!result.ok) throw new Error(`${layout}: ${result.error.code} ${result.error.message}`);
  return result;
}

const cases: [LayoutKey, RideSpec][] = [
  ['A', SPEC],
  ['B', { ...SPEC, hz: 2, deviceSerial: 'DST-20001' }],
  ['C', { ...SPEC, deviceSerial: undefined }],
];

describe.each(cases)('layout %s', (layout, spec) => {
  const ride = parsed(layout, spec);
  const { summary } = ride;

  it('parses without warnings and reads every column', () => {
    expect(summary.warnings).toEqual([]);
    for (const column of ride.metadata.columns) expect(column.field, column.header).not.toBeNull();
  });

  it('gives the spec start, phases and duration', () => {
    expect(summary.startedAt).toBe('2026-10-05T08:30:00.000Z');
    expect(summary.passiveS).toBe(spec.warmupMin * 60);
    expect(summary.activeS).toBe(spec.activeMin * 60);
    expect(summary.cooldownS).toBe(spec.cooldownMin * 60);
    expect(summary.durationS).toBe((spec.warmupMin + spec.activeMin + spec.cooldownMin) * 60);
    expect(summary.samples).toBe(((spec.warmupMin + spec.activeMin + spec.cooldownMin) * 60 * spec.hz));
  });

  it('gives the spec power, cadence and stimulation within rounding', () => {
    expect(Math.abs(summary.meanPowerW! / spec.meanPowerW - 1)).toBeLessThan(0.02);
    expect(Math.abs(summary.meanCadenceRpm! - spec.cadenceRpm)).toBeLessThan(1.5);
    expect(summary.pulseWidthUs).toBe(300);
    expect(summary.frequencyHz).toBe(35);
    expect(Object.keys(summary.channels).sort()).toEqual(Object.keys(spec.currents).sort());
    for (const [channel, plateau] of Object.entries(spec.currents)) {
      const mean = summary.channels[channel as keyof typeof summary.channels]!.meanCurrentMa!;
      expect(Math.abs(mean / plateau! - 1), channel).toBeLessThan(0.05);
    }
  });

  it('gives a distance of about two metres per crank turn', () => {
    const turns = spec.cadenceRpm * (spec.warmupMin + spec.activeMin) + (spec.cadenceRpm - 5) * spec.cooldownMin;
    expect(Math.abs(summary.distanceM! / (2 * turns) - 1)).toBeLessThan(0.05);
  });
});

describe('what sets the layouts apart', () => {
  it('A: UTF-8 commas with a key: value preamble naming the cycle', () => {
    const { metadata } = parsed('A', SPEC);
    expect(metadata).toMatchObject({ encoding: 'utf-8', delimiter: ',', decimalComma: false, deviceSerial: 'KBA-1234', deviceName: 'Kinloop Bench Cycle A' });
    expect(metadata.columns.map((c) => c.field)).toContain('phase');
  });

  it('B: Windows-1252, CRLF, semicolons with decimal commas, phases from the currents', () => {
    const spec = { ...SPEC, hz: 2, deviceSerial: 'DST-20001' };
    const bytes = RIDE_LAYOUTS.B.write(generateRide(spec, 5));
    expect(bytes.includes(0xb5)).toBe(true);
    expect(new TextDecoder('windows-1252').decode(bytes.slice(0, 200))).toContain('\r\n');
    const { metadata } = parsed('B', spec);
    expect(metadata).toMatchObject({ encoding: 'windows-1252', delimiter: ';', decimalComma: true, deviceSerial: 'DST-20001', deviceName: 'Demo Stim Trainer' });
    const fields = metadata.columns.map((c) => c.field);
    expect(fields).not.toContain('phase');
    expect(fields).not.toContain('distance');
  });

  it('B: writes hours in the clock once a ride passes an hour', () => {
    const spec = { ...SPEC, hz: 2, activeMin: 55 };
    const text = new TextDecoder('windows-1252').decode(RIDE_LAYOUTS.B.write(generateRide(spec, 5)));
    expect(text).toContain('Time (h:mm:ss)');
    expect(text).toContain('\r\n1:00:00,0;');
    expect(parsed('B', spec).summary.durationS).toBe(64 * 60);
  });

  it('C: tabs, a UTC timestamp on every row, no preamble, kW, km and A', () => {
    const { metadata } = parsed('C', SPEC);
    expect(metadata).toMatchObject({ encoding: 'utf-8', delimiter: '\t', headerLine: 1, deviceSerial: null });
    const units = Object.fromEntries(metadata.columns.map((c) => [c.field, c.unit]));
    expect(units).toMatchObject({ power: 'kW', distance: 'km', quadriceps_left: 'A', pulse_width: 'ms' });
  });

  it('writes only the channels the spec stimulates', () => {
    const spec = { ...SPEC, currents: { quadriceps_left: 60, quadriceps_right: 60 } };
    for (const layout of ['A', 'B', 'C'] as const) {
      expect(Object.keys(parsed(layout, { ...spec, hz: layout === 'B' ? 2 : 1 }).summary.channels).sort()).toEqual(['quadriceps_left', 'quadriceps_right']);
    }
  });

  it('names files after the cycle and the start', () => {
    expect(RIDE_LAYOUTS.A.fileName(SPEC)).toBe('KBA-1234_20261005_0930.csv');
    expect(RIDE_LAYOUTS.B.fileName(SPEC)).toBe('session_20261005_0930.csv');
    expect(RIDE_LAYOUTS.C.fileName(SPEC)).toBe('ride-2026-10-05T083000Z.tsv');
  });
});
