export { applyFlagChanges } from './apply';
export { conditionHeldAt, evaluateSessionFlags } from './evaluate';
export { planFlagChanges } from './plan';
export { DEFAULT_FLAG_THRESHOLDS, flagThresholdsSchema, type FlagThresholds } from './thresholds';
export {
  FLAG_KINDS,
  FLAG_SEVERITIES,
  FLAG_STATES,
  SESSION_FLAG_KINDS,
  type ExistingFlag,
  type FlagChange,
  type FlagCondition,
  type FlagInput,
  type FlagKind,
  type FlagSession,
  type FlagSeverity,
  type FlagState,
  type MetricShiftEvidence,
  type MissedWeekEvidence,
  type NoSessionEvidence,
  type SessionFlagKind,
  type ShortSessionEvidence,
} from './types';
