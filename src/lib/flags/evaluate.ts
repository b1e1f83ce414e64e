// Which session-flag conditions hold, as of now or as of an earlier moment,
// with the data we have now. Rules: ./missed-sessions.ts, ./metric-shift.ts,
// ./short-session.ts.
import { isoWeekOf, nextWeek } from '../time/iso-week';
import { localDate } from '../time/local-date';
import { startOfLocalDay } from '../time/zoned';
import { prepareFlagData, type Assessment, type FlagData, type Rules } from './flag-data';
import { assessMetricShift } from './metric-shift';
import { assessMissedSessions, missedEpisodeHeld } from './missed-sessions';
import { assessShortSessions } from './short-session';
import { SESSION_FLAG_KINDS, type FlagCondition, type FlagInput, type SessionFlagKind } from './types';

const RULES: Rules = {
  missed_sessions: assessMissedSessions,
  power_drop: (data, asOfMs) => assessMetricShift('power_drop', data, asOfMs),
  current_rise: (data, asOfMs) => assessMetricShift('current_rise', data, asOfMs),
  short_session: assessShortSessions,
};

export function assessAsOf(kind: SessionFlagKind, data: FlagData, asOfMs: number): Assessment {
  return RULES[kind](data, asOfMs);
}

/** The conditions that hold now: at most one per kind, the current episode. */
export function evaluateSessionFlags(input: FlagInput): FlagCondition[] {
  const data = prepareFlagData(input);
  return SESSION_FLAG_KINDS.map((kind) => assessAsOf(kind, data, data.nowMs).condition).filter(
    (c): c is FlagCondition => c !== null,
  );
}

export function conditionHeldAt(kind: SessionFlagKind, anchor: string, input: FlagInput): boolean {
  return episodeHeld(kind, anchor, prepareFlagData(input));
}

/**
 * Did the episode named by `anchor` hold, with the data we have now? A week
 * anchor: that week was missed. A gap anchor: the gap grew past the limit
 * before the next session. A session anchor: the rule held as of that
 * session's start, i.e. with it as the latest session.
 */
export function episodeHeld(kind: SessionFlagKind, anchor: string, data: FlagData): boolean {
  if (kind === 'missed_sessions') return missedEpisodeHeld(data, anchor);
  const session = data.calendar.sessions.find((s) => s.session.id === anchor);
  return session !== undefined && assessAsOf(kind, data, session.startMs).condition?.anchor === anchor;
}

/**
 * The latest condition of `kind` that held at any moment from `fromMs` to
 * `toMs`, with the data we have now, or null when none did. A rule's verdict
 * changes only when a session starts, a gap grows by a day (it is largest
 * just before the next session) or a week ends, so those moments suffice.
 */
export function latestHeldBetween(
  kind: SessionFlagKind,
  data: FlagData,
  fromMs: number,
  toMs: number,
): FlagCondition | null {
  const from = Math.min(fromMs, toMs);
  const moments = new Set<number>([from, toMs]);
  for (const s of data.calendar.sessions) {
    if (s.startMs > from && s.startMs <= toMs) {
      moments.add(s.startMs);
      moments.add(s.startMs - 1);
    }
  }
  if (kind === 'missed_sessions') {
    const fromWeek = isoWeekOf(localDate(new Date(from), data.timeZone), data.timeZone);
    for (let week = nextWeek(fromWeek); ; week = nextWeek(week)) {
      const startMs = Date.parse(startOfLocalDay(week.monday, data.timeZone));
      if (startMs > toMs) break;
      moments.add(startMs);
    }
  }
  for (const moment of [...moments].sort((a, b) => b - a)) {
    const condition = assessAsOf(kind, data, moment).condition;
    if (condition) return condition;
  }
  return null;
}
