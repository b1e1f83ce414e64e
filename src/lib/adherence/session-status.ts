// Whether a session counts toward its week. Rule from the Kinloop supervision
// issue: it counts when it lasts at least countThresholdPct % of the minutes
// per session of the prescription version in effect on its local start date;
// a shorter one is short. A session on a day without prescription is neither.
import type { PrescriptionVersion } from './types';

export type SessionStatus = 'counted' | 'short' | 'unprescribed';

export const DEFAULT_COUNT_THRESHOLD_PCT = 80;

/** The duration (s) from which a session counts under `version`. */
export function countingSeconds(version: PrescriptionVersion, countThresholdPct: number): number {
  return (version.minutesPerSession * 60 * countThresholdPct) / 100;
}

export function sessionStatus(
  durationS: number,
  version: PrescriptionVersion | null,
  countThresholdPct: number,
): SessionStatus {
  if (!version || version.sessionsPerWeek <= 0) return 'unprescribed';
  return durationS >= countingSeconds(version, countThresholdPct) ? 'counted' : 'short';
}
