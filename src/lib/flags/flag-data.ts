// The data every session-flag rule reads, prepared once per evaluation.
import { createAdherenceCalendar, type AdherenceCalendar, type PlacedSession } from '../adherence/calendar';
import { DEFAULT_FLAG_THRESHOLDS, type FlagThresholds } from './thresholds';
import type { FlagCondition, FlagInput, FlagSession, SessionFlagKind } from './types';

export interface FlagData {
  timeZone: string;
  nowMs: number;
  thresholds: FlagThresholds;
  calendar: AdherenceCalendar<FlagSession>;
}

/** A rule's verdict as of one moment: the condition when it holds, and a plain clause on the numbers either way. */
export interface Assessment {
  condition: FlagCondition | null;
  /** The numbers as a clause in lower case, for the sentences that say why a flag cleared or was withdrawn. */
  status: string;
}

export type Rule = (data: FlagData, asOfMs: number) => Assessment;
export type Rules = Record<SessionFlagKind, Rule>;

export function prepareFlagData(input: FlagInput): FlagData {
  const thresholds = { ...DEFAULT_FLAG_THRESHOLDS, ...input.thresholds };
  const nowMs = Date.parse(input.now);
  if (Number.isNaN(nowMs)) throw new RangeError(`now is not an instant: ${input.now}`);
  return {
    timeZone: input.timeZone,
    nowMs,
    thresholds,
    calendar: createAdherenceCalendar({
      timeZone: input.timeZone,
      prescriptions: input.prescriptions,
      pauses: input.pauses,
      sessions: input.sessions,
      countThresholdPct: thresholds.countThresholdPct,
    }),
  };
}

/** Sessions that had started by `asOfMs`, oldest first. */
export function sessionsAsOf(data: FlagData, asOfMs: number): PlacedSession<FlagSession>[] {
  return data.calendar.sessions.filter((s) => s.startMs <= asOfMs);
}
