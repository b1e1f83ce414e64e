import { describe, expect, it } from 'vitest';
import { comparedCount, drawSpark, halves, SPARK, weekOutcome, weightedPower } from '../../../src/lib/reports/figures';

describe('report figures', () => {
  it('weights mean power by active time and skips sessions without power', () => {
    expect(weightedPower([{ meanPowerW: 10, activeS: 600 }, { meanPowerW: 20, activeS: 1800 }, { meanPowerW: null, activeS: 900 }])).toBe(17.5);
    expect(weightedPower([{ meanPowerW: null, activeS: 100 }])).toBeNull();
  });

  it('compares at most four sessions at each end, never overlapping', () => {
    expect([0, 1, 3, 7, 8, 20].map(comparedCount)).toEqual([0, 0, 1, 3, 4, 4]);
  });

  it('splits more than thirteen weeks into two tables', () => {
    expect(halves([1, 2, 3])).toEqual([[1, 2, 3]]);
    expect(halves(Array.from({ length: 26 }, (_, i) => i)).map((h) => h.length)).toEqual([13, 13]);
    expect(halves(Array.from({ length: 15 }, (_, i) => i)).map((h) => h.length)).toEqual([8, 7]);
  });

  it('words a week: paused before under way, and no prescription before met', () => {
    expect(weekOutcome({ isoWeek: '2026-W48', prescribed: 3, met: false, paused: true }, '2026-W48')).toBe('Paused');
    expect(weekOutcome({ isoWeek: '2026-W48', prescribed: 3, met: true, paused: false }, '2026-W48')).toBe('Met (week under way)');
    expect(weekOutcome({ isoWeek: '2026-W47', prescribed: 0, met: false, paused: false }, '2026-W48')).toBe('No prescription');
    expect(weekOutcome({ isoWeek: '2026-W47', prescribed: 3, met: false, paused: false }, '2026-W48')).toBe('Not met');
  });

  it('draws the period edge to edge with zero at the bottom and the top value a tenth below the top', () => {
    const d = drawSpark([{ t: 0, y: 10 }, { t: 100, y: 20 }], [], 0, 100);
    expect(d.line).toBe(`M${SPARK.left.toFixed(1)} ${(SPARK.top + (1 - 10 / 22) * 96).toFixed(1)} L${(SPARK.width - SPARK.right).toFixed(1)} ${(SPARK.top + (1 - 20 / 22) * 96).toFixed(1)}`);
    expect(d.yZero).toBe((SPARK.height - SPARK.bottom).toFixed(1));
    expect(d.top).toBe(20);
  });
});
