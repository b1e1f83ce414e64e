export { computeAdherence, DEFAULT_ADHERENCE_WEEKS } from './compute';
export { createAdherenceCalendar, type AdherenceCalendar, type PlacedSession } from './calendar';
export { prescriptionTimeline, type PrescriptionTimeline } from './prescription';
export { countingSeconds, DEFAULT_COUNT_THRESHOLD_PCT, sessionStatus, type SessionStatus } from './session-status';
export type {
  Adherence,
  AdherenceInput,
  AdherenceWeek,
  Pause,
  PrescriptionVersion,
  SessionForAdherence,
} from './types';
