import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import { parseRide } from '../../../src/lib/rides/parse';
import { isoHasOffset, parseClock, parseIsoMs, toIsoUtc, wallTimeToEpochMs } from '../../../src/lib/rides/time';

const file = (text: string) => new TextEncoder().encode(text);

describe('clock times', () => {
  it('reads mm:ss and h:mm:ss as seconds', () => {
    expect(parseClock('01:30')).toBe(90);
    expect(parseClock('75:05')).toBe(4505);
    expect(parseClock('1:02:03')).toBe(3723);
    expect(parseClock('00:00:07.25')).toBe(7.25);
    expect(parseClock('00:07,5')).toBe(7.5);
    expect(parseClock(' 02:00\r')).toBe(120);
  });

  it('refuses what is not a clock time', () => {
    for (const s of ['', '12', '1:60', '1:2', '1:00:60', 'a:00', '01:30.', '01:30x', '1::30']) expect(parseClock(s), s).toBeNaN();
  });
});

describe('ISO 8601 date-times', () => {
  // source: ISO 8601-1:2019 extended format; luxon 3 (reference library) for the instants
  const cases = [
    '2026-10-05T09:30:00+02:00',
    '2026-10-05T09:30:00Z',
    '2026-10-05T09:30:00.125Z',
    '2026-10-05T09:30Z',
    '2026-10-05T09:30:00-03:30',
    '2026-10-05T09:30:00+0530',
    '2026-10-05T09:30:00+01',
    '2024-02-29T23:59:59.999+00:00',
  ];
  for (const s of cases) {
    it(`reads ${s} as luxon does`, () => {
      expect(parseIsoMs(s)).toBe(DateTime.fromISO(s, { setZone: true }).toMillis());
      expect(isoHasOffset(s)).toBe(true);
    });
  }

  it('reads a space separator, a decimal comma and a lower-case z', () => {
    expect(parseIsoMs('2026-10-05 09:30:00,5z')).toBe(Date.UTC(2026, 9, 5, 9, 30, 0, 500));
  });

  it('reads a wall time without offset as UTC and says it had none', () => {
    expect(parseIsoMs('2026-10-05T09:30:00')).toBe(Date.UTC(2026, 9, 5, 9, 30));
    expect(isoHasOffset('2026-10-05T09:30:00')).toBe(false);
  });

  it('refuses impossible dates and other formats', () => {
    for (const s of ['2026-02-29T10:00:00Z', '2026-13-01T00:00Z', '2026-10-05T24:00:00Z', '2026-10-05T10:60Z', '0999-01-01T00:00Z', '05.10.2026 09:30', '2026-10-05', '20261005T093000Z', '2026-10-05T09:30:00+25:00'])
      expect(parseIsoMs(s), s).toBeNaN();
  });

  it('turns a wall time into an instant in an IANA time zone', () => {
    // source: Directive 2000/84/EC (summer time from the last Sunday of March to the last Sunday of October); CET = UTC+1, CEST = UTC+2
    expect(wallTimeToEpochMs(Date.UTC(2026, 6, 14, 8, 15), 'Europe/Berlin')).toBe(Date.UTC(2026, 6, 14, 6, 15));
    expect(wallTimeToEpochMs(Date.UTC(2026, 0, 14, 8, 15), 'Europe/Berlin')).toBe(Date.UTC(2026, 0, 14, 7, 15));
    expect(wallTimeToEpochMs(0, 'Nowhere/Special')).toBeNull();
  });

  it('writes instants in UTC with Z', () => {
    expect(toIsoUtc(Date.UTC(2026, 9, 5, 7, 30))).toBe('2026-10-05T07:30:00.000Z');
  });
});

describe('time columns and startedAt in ride files', () => {
  const ride = (header: string, times: string[]) => parseRide(file(`${header},Power (W)\n${times.map((t) => `${t},10`).join('\n')}\n`));

  it('gives the same durations for every time format', () => {
    const variants = [
      ride('Time (s)', ['0', '2', '4', '6']),
      ride('Time (ms)', ['0', '2000', '4000', '6000']),
      ride('Time', ['00:00', '00:02', '00:04', '00:06']),
      ride('Time', ['0:00:00', '0:00:02', '0:00:04', '0:00:06']),
      ride('Timestamp', ['2026-10-05T09:30:00Z', '2026-10-05T09:30:02Z', '2026-10-05T09:30:04Z', '2026-10-05T09:30:06Z']),
    ];
    for (const r of variants) expect(r.ok && [r.summary.durationS, r.summary.samples]).toEqual([8, 4]);
  });

  it('takes startedAt from a Start time line (the PRODUCT.md example)', () => {
    const r = parseRide(file('Start time: 2026-10-05T09:30:00+02:00\nTime (s),Power (W)\n0,10\n1,10\n'));
    expect(r.ok && r.summary.startedAt).toBe('2026-10-05T07:30:00.000Z');
  });

  it("takes startedAt from the first row's timestamp after sorting", () => {
    const r = ride('Timestamp', ['2026-10-05T09:30:02+02:00', '2026-10-05T09:30:00+02:00', '2026-10-05T09:30:04+02:00']);
    expect(r.ok && r.summary.startedAt).toBe('2026-10-05T07:30:00.000Z');
  });

  it('reads wall times in the given time zone, else as UTC with a warning', () => {
    const text = file('Start time: 2026-07-14 08:15\nTime (s),Power (W)\n0,10\n1,10\n');
    const zoned = parseRide(text, { timeZone: 'Europe/Berlin' });
    expect(zoned.ok && [zoned.summary.startedAt, zoned.summary.warnings]).toEqual(['2026-07-14T06:15:00.000Z', []]);
    const utc = parseRide(text);
    expect(utc.ok && utc.summary.startedAt).toBe('2026-07-14T08:15:00.000Z');
    expect(utc.ok && utc.summary.warnings[0]).toContain('no UTC offset');
  });

  it('leaves startedAt empty for elapsed times without a start line', () => {
    const r = ride('Time (s)', ['0', '1']);
    expect(r.ok && r.summary.startedAt).toBeNull();
  });

  it('warns about a start time that is not ISO 8601', () => {
    const r = parseRide(file('Start time: 05.10.2026 09:30\nTime (s),Power (W)\n0,10\n1,10\n'));
    expect(r.ok && r.summary.startedAt).toBeNull();
    expect(r.ok && r.summary.warnings[0]).toContain('"05.10.2026 09:30" (line 1) is not an ISO 8601 date-time');
  });

  it('counts a 10 s step, also when binary decimals make it 10.000000000000002, and a longer step as a pause', () => {
    const r = ride('Time (s)', ['12.3', '22.3', '23.3', '40', '41']);
    // Δ: 10 (22.3 − 12.3 in binary is 10.000000000000002), 1, pause, 1, last = median(10, 1, 16.7, 1) = 5.5
    expect(r.ok && r.summary.durationS).toBe(17.5);
  });
});
