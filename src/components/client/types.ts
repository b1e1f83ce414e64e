// The JSON shapes of the client endpoints, as the client page's islands read them.
import type { ChannelLimits } from '../../lib/db/tables';
import type { FlagThresholds } from '../../lib/flags/thresholds';
import type { FlagKind, FlagSeverity, FlagState } from '../../lib/flags/types';

export interface PrescriptionVersionView {
  id: string;
  version: number;
  effectiveFrom: string;
  sessionsPerWeek: number;
  minutesPerSession: number;
  warmupMinutes: number | null;
  targetCadenceRpm: number | null;
  cadenceToleranceRpm: number | null;
  resistance: number | null;
  channels: Record<string, ChannelLimits>;
  notes: string | null;
  createdBy: { userId: string; name: string | null };
  createdAt: string;
}

export interface PrescriptionData {
  current: PrescriptionVersionView | null;
  upcoming: PrescriptionVersionView[];
  /** Newest version first. */
  history: PrescriptionVersionView[];
}

export interface AdherenceWeek {
  isoWeek: string;
  prescribed: number;
  counted: number;
  short: number;
  met: boolean;
  paused: boolean;
}

export interface AdherenceData {
  weeks: AdherenceWeek[];
  streakWeeks: number;
  adherence4wPct: number | null;
}

export interface TrendPoint {
  sessionId: string;
  startedAt: string;
  meanPowerW: number | null;
  baselineW: number | null;
  reviewBelowW: number | null;
  durationS: number;
  activeS: number;
  targetS: number | null;
  counted: boolean;
  currentPerWattMaPerW: number | null;
}

export interface TrendsData {
  sessions: TrendPoint[];
  /** Slope over the last eight weeks, or null with fewer than three sessions in them. */
  powerTrendWPerWeek: number | null;
  thresholds: FlagThresholds;
}

export interface SessionRow {
  id: string;
  startedAt: string;
  summary: {
    durationS: number;
    activeS: number;
    meanPowerW: number | null;
    peakPower5sW: number | null;
    distanceM: number | null;
    currentPerWattMaPerW: number | null;
  };
}

export interface SessionsPage {
  sessions: SessionRow[];
  nextBefore: string | null;
}

export interface FlagEvent {
  at: string;
  action: string;
  by: { userId: string; name: string | null } | null;
  note: string | null;
  detail: Record<string, unknown> | null;
}

export interface FlagWithHistory {
  id: string;
  kind: FlagKind;
  severity: FlagSeverity;
  state: FlagState;
  raisedAt: string;
  updatedAt: string;
  reason: string;
  evidence: unknown;
  clearedAt: string | null;
  snoozedUntil: string | null;
  history: FlagEvent[];
}

export interface PauseView {
  id: string;
  from: string;
  to: string;
  reason: string;
  state: 'upcoming' | 'active' | 'ended' | 'cancelled';
  createdAt: string;
  endedAt: string | null;
}

export interface NoteView {
  id: string;
  body: string;
  author: { userId: string; name: string };
  createdAt: string;
}
