// Flag vocabulary (PRODUCT.md "flag"; bp_drop, possible post-exercise
// hypotension, and the withdrawn state come from a newer issue) and the shapes
// the session-flag rules and the planner work on.
import type { Pause, PrescriptionVersion, SessionForAdherence } from '../adherence/types';
import type { RideSummary } from '../rides/types';
import type { FlagThresholds } from './thresholds';

export const FLAG_KINDS = [
  'missed_sessions',
  'power_drop',
  'current_rise',
  'short_session',
  'bp_rise',
  'bp_drop',
  'skin_concern',
] as const;
export type FlagKind = (typeof FLAG_KINDS)[number];

/** The kinds derived from sessions, which evaluateSessionFlags and planFlagChanges handle. */
export const SESSION_FLAG_KINDS = ['missed_sessions', 'power_drop', 'current_rise', 'short_session'] as const;
export type SessionFlagKind = (typeof SESSION_FLAG_KINDS)[number];

/** Most severe first. */
export const FLAG_SEVERITIES = ['urgent', 'review', 'info'] as const;
export type FlagSeverity = (typeof FLAG_SEVERITIES)[number];

/** `withdrawn`: the system found the condition never held while the flag was open. */
export const FLAG_STATES = ['open', 'acknowledged', 'resolved', 'withdrawn'] as const;
export type FlagState = (typeof FLAG_STATES)[number];

export interface FlagSession
  extends SessionForAdherence,
    Pick<RideSummary, 'meanPowerW' | 'currentPerWattMaPerW'> {}

export interface FlagInput {
  timeZone: string;
  /** ISO 8601 instant; conditions are judged as of this moment. */
  now: string;
  prescriptions: PrescriptionVersion[];
  pauses: Pause[];
  /** Every session of the client, in any order. */
  sessions: FlagSession[];
  /** Clinic settings; missing values take DEFAULT_FLAG_THRESHOLDS. */
  thresholds?: Partial<FlagThresholds>;
}

export interface MissedWeekEvidence {
  rule: 'missed_week';
  isoWeek: string;
  monday: string;
  sunday: string;
  prescribed: number;
  counted: number;
  short: number;
  sessionIds: string[];
}

export interface NoSessionEvidence {
  rule: 'no_session';
  /** Local date of the last session, or the program start when there was none since. */
  since: string;
  lastSessionId: string | null;
  /** Program days after `since` up to the day judged, paused days left out. */
  days: number;
  pausedDays: number;
  limitDays: number;
}

export interface MetricShiftEvidence {
  metric: 'meanPowerW' | 'currentPerWattMaPerW';
  /** Median of the baseline sessions. */
  baseline: number;
  baselineSessionIds: string[];
  /** The latest two counted sessions, older first; changePct is signed, rounded to 0.1. */
  latest: { id: string; startedAt: string; value: number; changePct: number }[];
  reviewPct: number;
  urgentPct: number | null;
}

export interface ShortSessionEvidence {
  countThresholdPct: number;
  /** The last three sessions judged, older first. */
  sessions: { id: string; startedAt: string; durationS: number; countsFromS: number; short: boolean }[];
  shortSessionIds: string[];
}

interface EvidenceByKind {
  missed_sessions: MissedWeekEvidence | NoSessionEvidence;
  power_drop: MetricShiftEvidence;
  current_rise: MetricShiftEvidence;
  short_session: ShortSessionEvidence;
}

/**
 * A session-flag condition that holds. `anchor` names the episode: the ISO
 * week of a missed week ('2026-W41'), `gap:<session id>` or
 * `gap:start:<date>` for a stretch without sessions, and the latest evidence
 * session's id for power_drop, current_rise and short_session.
 */
export type FlagCondition = {
  [K in SessionFlagKind]: {
    kind: K;
    severity: FlagSeverity;
    anchor: string;
    /** One plain sentence with the numbers. */
    reason: string;
    evidence: EvidenceByKind[K];
  };
}[SessionFlagKind];

/** A flag as stored. */
export interface ExistingFlag {
  id: string;
  kind: FlagKind;
  severity: FlagSeverity;
  state: FlagState;
  anchor: string;
  reason: string;
  evidence: unknown;
  /** The `now` of the planFlagChanges call that raised it; never changed by updates. */
  raisedAt: string;
  /** Set when the condition held and has since cleared; the flag stays for the therapist. */
  clearedAt: string | null;
  snoozedUntil: string | null;
}

/**
 * What to do with the stored flags. Applying:
 * - raise: a new flag, state open, raisedAt = input.now; with `cleared`, an
 *   episode that held and no longer does (clearedAt = input.now);
 * - update: replace severity, anchor, reason, evidence; clearedAt = null;
 *   state becomes open when `reopen`; snoozedUntil is left as it is;
 * - withdraw: state withdrawn;
 * - clear: replace severity, anchor, reason, evidence with `condition` (the
 *   latest episode that held); clearedAt = input.now unless already set;
 *   state becomes open when `reopen`.
 */
export type FlagChange =
  | { type: 'raise'; condition: FlagCondition; cleared?: { why: string } }
  | { type: 'update'; flagId: string; condition: FlagCondition; reopen: boolean }
  | { type: 'withdraw'; flagId: string; why: string }
  | { type: 'clear'; flagId: string; why: string; condition: FlagCondition; reopen: boolean };
