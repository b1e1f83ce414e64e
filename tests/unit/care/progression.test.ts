import { describe, expect, it } from 'vitest';
import { judgeProgression, nextMonday, progressionPlanSchema, type ProgressionFacts } from '../../../src/lib/care/progression';

const facts = (over: Partial<ProgressionFacts> = {}, version: Partial<ProgressionFacts['version']> = {}): ProgressionFacts => ({
  version: { id: 'v1', effectiveFrom: '2026-11-02', minutesPerSession: 20, resistance: null, progression: { kind: 'minutes', step: 5, upTo: 60 }, ...version },
  lastWeek: { isoWeek: '2026-W48', monday: '2026-11-23', prescribed: 3, counted: 3, paused: false },
  openUrgentFlags: 0,
  currentPerWatt: { lastWeek: [2.0, 2.1, 2.2], before: [2.0, 2.0, 2.1, 2.1] },
  currentRiseLimitPct: 25,
  ...over,
});

describe('judgeProgression', () => {
  it('proposes +5 min after a met week, with its evidence', () => {
    const j = judgeProgression(facts());
    expect(j.ready).toBe(true);
    if (!j.ready) return;
    expect(j.proposed).toEqual({ minutesPerSession: 25 });
    // Hand-worked: median of 2.0, 2.1, 2.2 is 2.1; of 2.0, 2.0, 2.1, 2.1 is 2.05; (2.1 − 2.05) / 2.05 = 2.439… % → 2.4.
    expect(j.evidence.currentPerWatt).toEqual({ lastWeekMedian: 2.1, beforeMedian: 2.05, risePct: 2.4, limitPct: 25 });
    expect(j.evidence).toMatchObject({ isoWeek: '2026-W48', counted: 3, prescribed: 3, from: 20, to: 25, kind: 'minutes' });
  });

  it('stops at the target: 58 + 5 gives 60, and at 60 nothing more', () => {
    const j = judgeProgression(facts({}, { minutesPerSession: 58 }));
    expect(j.ready && j.proposed).toEqual({ minutesPerSession: 60 });
    const done = judgeProgression(facts({}, { minutesPerSession: 60 }));
    expect(done.ready).toBe(false);
  });

  it('steps resistance from none (0) by 0.5', () => {
    const j = judgeProgression(facts({}, { progression: { kind: 'resistance', step: 0.5, upTo: 4 } }));
    expect(j.ready && j.proposed).toEqual({ resistance: 0.5 });
  });

  it('needs every prescribed session of the week: 2 of 3 is not enough', () => {
    const j = judgeProgression(facts({ lastWeek: { isoWeek: '2026-W48', monday: '2026-11-23', prescribed: 3, counted: 2, paused: false } }));
    expect(j).toEqual({ ready: false, reasons: ['2 of 3 prescribed sessions counted in the week 2026-W48.'] });
  });

  it('does not propose after a paused week, or a version that began inside the week', () => {
    expect(judgeProgression(facts({ lastWeek: { isoWeek: '2026-W48', monday: '2026-11-23', prescribed: 0, counted: 0, paused: true } })).ready).toBe(false);
    expect(judgeProgression(facts({}, { effectiveFrom: '2026-11-25' })).ready).toBe(false);
    expect(judgeProgression(facts({}, { effectiveFrom: '2026-11-23' })).ready).toBe(true);
  });

  it('does not propose while an urgent flag is open', () => {
    const j = judgeProgression(facts({ openUrgentFlags: 1 }));
    expect(j).toEqual({ ready: false, reasons: ['1 urgent flag is open.'] });
  });

  it('current per watt: a rise of exactly the limit passes, just above it does not', () => {
    // 2.5 against 2.0 is +25 %; 2.52 against 2.0 is +26 %.
    expect(judgeProgression(facts({ currentPerWatt: { lastWeek: [2.5], before: [2.0] } })).ready).toBe(true);
    const j = judgeProgression(facts({ currentPerWatt: { lastWeek: [2.52], before: [2.0] } }));
    expect(j).toEqual({ ready: false, reasons: ["Current per watt rose 26 % in the week 2026-W48, more than the clinic's 25 %."] });
  });

  it('without current readings the current criterion is not judged', () => {
    const j = judgeProgression(facts({ currentPerWatt: { lastWeek: [], before: [] } }));
    expect(j.ready && j.evidence.currentPerWatt.risePct).toBeNull();
  });

  it('no plan, no proposal', () => {
    expect(judgeProgression(facts({}, { progression: null })).ready).toBe(false);
  });
});

describe('nextMonday', () => {
  // Checked against a calendar: 2026-12-02 is a Wednesday, 2026-12-07 a Monday.
  it('is the Monday after the day, a week on when the day is a Monday', () => {
    expect(nextMonday('2026-12-02')).toBe('2026-12-07');
    expect(nextMonday('2026-12-06')).toBe('2026-12-07');
    expect(nextMonday('2026-12-07')).toBe('2026-12-14');
    expect(nextMonday('2026-12-28')).toBe('2027-01-04');
  });
});

describe('progressionPlanSchema', () => {
  it('keeps minutes within the prescription range', () => {
    expect(progressionPlanSchema.safeParse({ kind: 'minutes', step: 5, upTo: 60 }).success).toBe(true);
    expect(progressionPlanSchema.safeParse({ kind: 'minutes', step: 5, upTo: 61 }).success).toBe(false);
    expect(progressionPlanSchema.safeParse({ kind: 'speed', step: 5, upTo: 6 }).success).toBe(false);
  });
});
