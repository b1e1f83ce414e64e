import { describe, it, expect } from 'vitest';
import { minuteRows, phaseRanges } from '../../../src/components/rides/minute-rows';
import type { ChartSeries, Point } from '../../../src/components/rides/types';

type Phases = ChartSeries['phases'];

/** One point a second from `from` to `to` inclusive, with the value `value(t)`. */
function everySecond(from: number, to: number, value: (t: number) => number): Point[] {
  const out: Point[] = [];
  for (let t = from; t <= to; t++) out.push([t, value(t)]);
  return out;
}

describe('phaseRanges', () => {
  it('runs each phase until the next one begins, and the last to its own end', () => {
    const phases: Phases = [
      { phase: 'passive', fromS: 0, toS: 59 },
      { phase: 'active', fromS: 60, toS: 1799 },
      { phase: 'cooldown', fromS: 1800, toS: 1919 },
    ];
    expect(phaseRanges(phases)).toEqual([
      { phase: 'passive', from: 0, to: 60 },
      { phase: 'active', from: 60, to: 1800 },
      { phase: 'cooldown', from: 1800, to: 1919 },
    ]);
  });

  it('is empty without phases', () => {
    expect(phaseRanges([])).toEqual([]);
  });
});

describe('minuteRows', () => {
  const active: Phases = [{ phase: 'active', fromS: 0, toS: 600 }];

  it('gives one row per started minute, and at least one', () => {
    expect(minuteRows(active, [], 0)).toHaveLength(1);
    expect(minuteRows(active, [], 60)).toHaveLength(1);
    expect(minuteRows(active, [], 61)).toHaveLength(2);
    expect(minuteRows(active, [], 150).map((r) => r.minute)).toEqual([0, 1, 2]);
  });

  it('names the phase that covers most of each minute', () => {
    const phases: Phases = [
      { phase: 'passive', fromS: 0, toS: 39 },
      { phase: 'active', fromS: 40, toS: 99 },
      { phase: 'cooldown', fromS: 100, toS: 180 },
    ];
    // minute 0: passive 40 s, active 20 s; minute 1: active 40 s, cool-down 20 s; minute 2: cool-down
    expect(minuteRows(phases, [], 180).map((r) => r.phase)).toEqual(['passive', 'active', 'cooldown']);
  });

  it('lets a phase that starts a third into the minute win it', () => {
    const phases: Phases = [
      { phase: 'passive', fromS: 0, toS: 19 },
      { phase: 'active', fromS: 20, toS: 120 },
    ];
    expect(minuteRows(phases, [], 120)[0].phase).toBe('active');
  });

  it('averages each series over the points inside the minute, in the order given', () => {
    const cadence = everySecond(0, 119, (t) => (t < 60 ? 40 : 50));
    const power = everySecond(0, 119, (t) => t);
    const rows = minuteRows(active, [cadence, power], 119);
    expect(rows).toHaveLength(2);
    expect(rows[0].values).toEqual([40, 29.5]);
    expect(rows[1].values).toEqual([50, 89.5]);
  });

  it('puts a point on a minute boundary in the minute it starts', () => {
    const rows = minuteRows(active, [[[59, 1], [60, 3]]], 120);
    expect(rows[0].values).toEqual([1]);
    expect(rows[1].values).toEqual([3]);
  });

  it('keeps the final instant in the last row when the end falls on a minute boundary', () => {
    const rows = minuteRows(active, [[[90, 2], [120, 4]]], 120);
    expect(rows).toHaveLength(2);
    expect(rows[1].values).toEqual([3]);
  });

  it('leaves out points after the last row', () => {
    const rows = minuteRows(active, [[[30, 2], [125, 100]]], 60);
    expect(rows).toHaveLength(1);
    expect(rows[0].values).toEqual([2]);
  });

  it('gives null for a series without points in the minute, not zero', () => {
    const rows = minuteRows(active, [everySecond(0, 59, () => 10), []], 120);
    expect(rows[0].values).toEqual([10, null]);
    expect(rows[1].values).toEqual([null, null]);
  });

  it('describes a one-sample session', () => {
    expect(minuteRows([{ phase: 'active', fromS: 0, toS: 0 }], [[[0, 5]]], 1)).toEqual([{ minute: 0, phase: 'active', values: [5] }]);
  });

  it('names a one-sample run that is alone in its minute', () => {
    const phases: Phases = [
      { phase: 'active', fromS: 0, toS: 59 },
      { phase: 'cooldown', fromS: 60, toS: 60 },
    ];
    expect(minuteRows(phases, [], 61).map((r) => r.phase)).toEqual(['active', 'cooldown']);
  });

  it('gives null for a minute that no phase reaches', () => {
    const rows = minuteRows([{ phase: 'active', fromS: 0, toS: 30 }], [], 120);
    expect(rows[1].phase).toBeNull();
  });

  // A 1 Hz ride file with samples at t = 0…120 has phase runs ending at toS 120
  // and durationS 121 (the last sample's Δ is the median interval), and
  // SessionView passes endS = max(last toS, durationS) = 121. That makes a third
  // row, 120–180 s, holding only the last sample. No run has any length in that
  // minute and none starts in it, so the row gets phase null ("—") although its
  // sample is active. The module's own comment says the final instant still
  // names the phase; the fallback only looks for runs that start in the minute,
  // not for the run that ends there.
  it('names the phase of the final sample when it sits alone in the last row', () => {
    const phases: Phases = [
      { phase: 'passive', fromS: 0, toS: 59 },
      { phase: 'active', fromS: 60, toS: 120 },
    ];
    const power = everySecond(0, 120, () => 20);
    const rows = minuteRows(phases, [power], 121);
    expect(rows).toHaveLength(3);
    expect(rows[2].values).toEqual([20]);
    expect(rows[2].phase).toBe('active');
  });
});
