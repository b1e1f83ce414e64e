import { describe, expect, it } from 'vitest';
import { parseRide } from '../../../src/lib/rides/parse';
import { defaultUnit, findUnit, type Quantity } from '../../../src/lib/rides/units';

const convert = (q: Quantity, unit: string, v: number) => {
  const u = findUnit(q, unit);
  if (u === null) throw new Error(`no unit ${unit}`);
  // As columns.ts converts every cell.
  return (v * u.multiply) / u.divide;
};
const file = (text: string) => new TextEncoder().encode(text);

describe('unit conversions', () => {
  it('converts miles with the international mile', () => {
    // source: international yard and pound agreement (1959); NIST SP 811 (2008), B.8: mile (international) = 1.609344 E+03 m, exact
    expect(convert('distance', 'mi', 1)).toBe(1609.344);
    expect(convert('distance', 'miles', 2.5)).toBeCloseTo(4023.36, 9);
  });

  it('applies the SI prefixes kilo, milli and micro', () => {
    // source: BIPM, The International System of Units (SI Brochure, 9th ed. 2019), Table 7: kilo = 10^3, milli = 10^-3, micro = 10^-6
    expect(convert('distance', 'km', 1.5)).toBe(1500);
    expect(convert('power', 'kW', 0.25)).toBe(250);
    expect(convert('current', 'A', 0.045)).toBeCloseTo(45, 12);
    expect(convert('pulse_width', 'ms', 0.3)).toBeCloseTo(300, 12);
    expect(convert('time', 'ms', 1500)).toBe(1.5);
  });

  it('reads the micro sign, the Greek mu and "us" as microseconds', () => {
    for (const spelling of ['µs', 'μs', 'us', 'US', 'microseconds']) expect(findUnit('pulse_width', spelling)?.symbol, spelling).toBe('µs');
  });

  it('keeps canonical units as they are and knows the defaults of PRODUCT.md', () => {
    expect(convert('power', 'W', 123.4)).toBe(123.4);
    expect(convert('current', 'mA', 61.5)).toBe(61.5);
    expect(convert('cadence', 'rev/min', 40)).toBe(40);
    const defaults = (['time', 'cadence', 'power', 'distance', 'current', 'pulse_width', 'frequency', 'heart_rate'] as const).map((q) => defaultUnit(q).symbol);
    expect(defaults).toEqual(['s', 'rpm', 'W', 'm', 'mA', 'µs', 'Hz', 'bpm']);
  });

  it('does not read a unit of another quantity', () => {
    expect(findUnit('power', 'rpm')).toBeNull();
    expect(findUnit('distance', 'hp')).toBeNull();
  });

  it('applies the units of a ride file', () => {
    const r = parseRide(file('Time (s),Power (kW),Distance (mi),ch1 (A)\n0,0.02,0,0.05\n1,0.02,0.0005,0.05\n2,0.02,0.001,0.05\n'));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    // source: NIST SP 811 (mile = 1609.344 m); BIPM SI Brochure (kilo, milli)
    expect(r.summary.distanceM).toBe(1.6);
    expect(r.summary.meanPowerW).toBe(20);
    expect(r.summary.channels.channel_1?.meanCurrentMa).toBe(50);
    expect(r.metadata.columns.map((c) => c.unit)).toEqual(['s', 'kW', 'mi', 'A']);
  });

  it('ignores a column whose unit it does not know, with a warning', () => {
    const r = parseRide(file('Time (s),Power (hp),Cadence (rpm)\n0,1,40\n1,1,40\n'));
    expect(r.ok && r.summary.meanPowerW).toBeNull();
    expect(r.ok && r.summary.warnings.join()).toContain('Column "Power (hp)" (line 1) was ignored');
  });
});
