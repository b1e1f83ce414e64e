import { describe, expect, it } from 'vitest';
import { comparedCount, drawSpark, halves, weekOutcome, weightedPower } from '../../../src/lib/reports/figures';

describe('report figures', () => {
  it('weights mean power by active time and skips sessions without power', () => {
    // (10 × 600 + 20 × 1800) / 2400 = 17.5
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
    // Hand-worked for the 420 × 130 chart: the plot runs from x 74 to 410 and
    // from y 10 (top) to 106 (zero), 96 high; the axis tops out at 1.1 × 20 = 22,
    // so 10 sits at 10 + 96 × 12/22 = 62.4 and 20 at 10 + 96 × 2/22 = 18.7.
    const d = drawSpark([{ t: 0, y: 10 }, { t: 100, y: 20 }], [], 0, 100);
    expect(d.line).toBe('M74.0 62.4 L410.0 18.7');
    expect(d.yZero).toBe('106.0');
    expect(d.yTop).toBe('18.7');
    expect(d.xRight).toBe('410.0');
    expect(d.top).toBe(20);
    // Halfway through the period is halfway across: 74 + 336 / 2 = 242.
    expect(drawSpark([{ t: 50, y: 0 }], [{ t: 0, y: 20 }], 0, 100)).toMatchObject({ line: 'M242.0 106.0', reference: 'M74.0 18.7' });
  });
});
