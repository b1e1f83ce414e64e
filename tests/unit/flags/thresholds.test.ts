import { describe, expect, it } from 'vitest';
import { DEFAULT_FLAG_THRESHOLDS, flagThresholdsSchema } from '../../../src/lib/flags';

describe('flag thresholds', () => {
  it('has the defaults of the supervision issue', () => {
    // source: the Kinloop supervision issue (clinic setting defaults)
    expect(DEFAULT_FLAG_THRESHOLDS).toEqual({
      countThresholdPct: 80,
      missedNoSessionDays: 10,
      powerDropReviewPct: 20,
      powerDropUrgentPct: 35,
      baselineSessions: 6,
      baselineMinSessions: 4,
      currentRiseReviewPct: 25,
      shortSessionsOfLast3: 2,
    });
  });

  it('fills in what a clinic has not set', () => {
    expect(flagThresholdsSchema.parse({})).toEqual(DEFAULT_FLAG_THRESHOLDS);
    expect(flagThresholdsSchema.parse({ missedNoSessionDays: 14 })).toEqual({ ...DEFAULT_FLAG_THRESHOLDS, missedNoSessionDays: 14 });
  });

  it('refuses contradictory or impossible settings', () => {
    expect(flagThresholdsSchema.safeParse({ powerDropReviewPct: 40 }).success).toBe(false); // above the urgent 35
    expect(flagThresholdsSchema.safeParse({ baselineMinSessions: 8 }).success).toBe(false); // more than the 6 baseline sessions
    expect(flagThresholdsSchema.safeParse({ shortSessionsOfLast3: 4 }).success).toBe(false);
    expect(flagThresholdsSchema.safeParse({ missedNoSessionDays: 2.5 }).success).toBe(false);
    expect(flagThresholdsSchema.safeParse({ countThresholdPct: 0 }).success).toBe(false);
  });
});
