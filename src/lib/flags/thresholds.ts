// Flag thresholds are clinic settings; the defaults come from the Kinloop
// supervision issue. An admin edits them; the schema fills in what a clinic
// has not set and refuses contradictory values.
import { z } from 'zod';
import { DEFAULT_COUNT_THRESHOLD_PCT } from '../adherence/session-status';

export const DEFAULT_FLAG_THRESHOLDS = Object.freeze({
  /** A session counts when it lasts at least this % of the prescribed minutes. */
  countThresholdPct: DEFAULT_COUNT_THRESHOLD_PCT,
  /** No session for more than this many program days (paused days not counted) is urgent. */
  missedNoSessionDays: 10,
  powerDropReviewPct: 20,
  powerDropUrgentPct: 35,
  /** Counted sessions before the latest two whose median is the usual level. */
  baselineSessions: 6,
  /** Fewest of those needed before power or current is compared at all. */
  baselineMinSessions: 4,
  currentRiseReviewPct: 25,
  /** How many of the last three sessions must be short to raise short_session. */
  shortSessionsOfLast3: 2,
});

export const flagThresholdsSchema = z
  .object({
    countThresholdPct: z.number().gt(0).max(100).default(DEFAULT_FLAG_THRESHOLDS.countThresholdPct),
    missedNoSessionDays: z.number().int().min(1).default(DEFAULT_FLAG_THRESHOLDS.missedNoSessionDays),
    powerDropReviewPct: z.number().gt(0).lt(100).default(DEFAULT_FLAG_THRESHOLDS.powerDropReviewPct),
    powerDropUrgentPct: z.number().gt(0).lt(100).default(DEFAULT_FLAG_THRESHOLDS.powerDropUrgentPct),
    baselineSessions: z.number().int().min(1).default(DEFAULT_FLAG_THRESHOLDS.baselineSessions),
    baselineMinSessions: z.number().int().min(1).default(DEFAULT_FLAG_THRESHOLDS.baselineMinSessions),
    currentRiseReviewPct: z.number().gt(0).default(DEFAULT_FLAG_THRESHOLDS.currentRiseReviewPct),
    shortSessionsOfLast3: z.number().int().min(1).max(3).default(DEFAULT_FLAG_THRESHOLDS.shortSessionsOfLast3),
  })
  .refine((t) => t.powerDropUrgentPct >= t.powerDropReviewPct, {
    message: 'The urgent power drop must be at least the review power drop',
    path: ['powerDropUrgentPct'],
  })
  .refine((t) => t.baselineMinSessions <= t.baselineSessions, {
    message: 'The fewest baseline sessions cannot exceed the baseline sessions',
    path: ['baselineMinSessions'],
  });

export type FlagThresholds = z.output<typeof flagThresholdsSchema>;
