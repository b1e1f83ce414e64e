// missed_sessions. Rules from the Kinloop supervision issue; thresholds are
// clinic settings.
// - review: the latest finished, unpaused week with a prescription had fewer
//   counted sessions than prescribed. Paused weeks are passed over, as for the
//   streak, so a missed week stays flagged through a pause that follows it; a
//   later judged week that is met clears it.
// - urgent: no session at all on more than missedNoSessionDays program days,
//   counted from the day after the last session (or from the program start,
//   the first prescription's effective date, when there was none since) up to
//   and including the day judged. Paused days and days without a prescription
//   are not counted.
import { isoWeekOf, parseIsoWeek, previousWeek, type IsoWeek } from '../time/iso-week';
import { addDays, localDate } from '../time/local-date';
import type { AdherenceWeek } from '../adherence/types';
import { sessionsAsOf, type Assessment, type FlagData } from './flag-data';
import { count } from '../format/numbers';
import { formatDate, weekOf } from '../time/format';
import { missedWeekReason, noSessionReason } from './reason';
import { REASON_LOCALE } from './words';
import type { FlagCondition } from './types';

const WEEK_ANCHOR = /^\d{4}-W\d{2}$/;
const GAP_PREFIX = 'gap:';
const GAP_START_PREFIX = 'gap:start:';

function latestJudgedWeek(data: FlagData, today: string): { week: IsoWeek; status: AdherenceWeek } | null {
  const start = data.calendar.timeline.programStart;
  if (!start) return null;
  for (let week = previousWeek(isoWeekOf(today, data.timeZone)); week.sunday >= start; week = previousWeek(week)) {
    const status = data.calendar.week(week, today);
    if (!status.hasPrescription) return null;
    if (!status.paused) return { week, status };
  }
  return null;
}

function weekCondition(data: FlagData, week: IsoWeek, status: AdherenceWeek): FlagCondition | null {
  if (status.counted >= status.prescribed) return null;
  const reason = missedWeekReason({ monday: week.monday, prescribed: status.prescribed, counted: status.counted }, REASON_LOCALE);
  return {
    kind: 'missed_sessions',
    severity: 'review',
    anchor: week.isoWeek,
    reason,
    evidence: {
      rule: 'missed_week',
      isoWeek: week.isoWeek,
      monday: week.monday,
      sunday: week.sunday,
      prescribed: status.prescribed,
      counted: status.counted,
      short: status.short,
      sessionIds: data.calendar.sessionsInWeek(week.isoWeek).map((s) => s.session.id),
    },
  };
}

interface Gap {
  anchor: string;
  since: string;
  lastSessionId: string | null;
  days: number;
  pausedDays: number;
}

function gapAsOf(data: FlagData, asOfMs: number): Gap | null {
  const start = data.calendar.timeline.programStart;
  if (!start) return null;
  const today = localDate(new Date(asOfMs), data.timeZone);
  const last = sessionsAsOf(data, asOfMs).at(-1);
  const fromLast = last !== undefined && last.localDate >= start;
  const since = fromLast ? last.localDate : start;
  let days = 0;
  let pausedDays = 0;
  for (let day = fromLast ? addDays(since, 1) : since; day <= today; day = addDays(day, 1)) {
    if (data.calendar.isPaused(day)) pausedDays += 1;
    else if (data.calendar.timeline.prescribedOn(day)) days += 1;
  }
  return {
    anchor: fromLast ? `${GAP_PREFIX}${last.session.id}` : `${GAP_START_PREFIX}${start}`,
    since,
    lastSessionId: fromLast ? last.session.id : null,
    days,
    pausedDays,
  };
}

function gapCondition(data: FlagData, gap: Gap): FlagCondition | null {
  const limitDays = data.thresholds.missedNoSessionDays;
  if (gap.days <= limitDays) return null;
  const reason = noSessionReason(gap, REASON_LOCALE);
  return {
    kind: 'missed_sessions',
    severity: 'urgent',
    anchor: gap.anchor,
    reason,
    evidence: {
      rule: 'no_session',
      since: gap.since,
      lastSessionId: gap.lastSessionId,
      days: gap.days,
      pausedDays: gap.pausedDays,
      limitDays,
    },
  };
}

export function assessMissedSessions(data: FlagData, asOfMs: number): Assessment {
  const today = localDate(new Date(asOfMs), data.timeZone);
  const judged = latestJudgedWeek(data, today);
  const gap = gapAsOf(data, asOfMs);
  const condition =
    (gap && gapCondition(data, gap)) ?? (judged && weekCondition(data, judged.week, judged.status)) ?? null;

  const weekText = judged
    ? `${weekOf(judged.week.monday, REASON_LOCALE)} had ${judged.status.counted} of the ${judged.status.prescribed} prescribed sessions counted`
    : 'there was no finished, unpaused week with a prescription';
  const gapText = !gap
    ? ''
    : gap.lastSessionId
      ? `, and the latest session was on ${formatDate(gap.since, REASON_LOCALE, 'weekdayDayMonth')}${gap.days > 0 ? ` (${count(gap.days, 'program day')} without one since)` : ''}`
      : `, and there was no session in the ${count(gap.days, 'program day')} since the start on ${formatDate(gap.since, REASON_LOCALE, 'weekdayDayMonth')}`;
  return { condition, status: `${weekText}${gapText}` };
}

/** Did the missed-sessions episode named by `anchor` hold, with the data in `data`? */
export function missedEpisodeHeld(data: FlagData, anchor: string): boolean {
  const today = localDate(new Date(data.nowMs), data.timeZone);
  if (WEEK_ANCHOR.test(anchor)) {
    let week: IsoWeek;
    try {
      week = parseIsoWeek(anchor);
    } catch {
      return false;
    }
    const status = data.calendar.week(week, today);
    return status.finished && status.hasPrescription && !status.paused && weekCondition(data, week, status) !== null;
  }
  if (!anchor.startsWith(GAP_PREFIX)) return false;
  const endMs = gapEndMs(data, anchor);
  if (endMs === null) return false;
  const gap = gapAsOf(data, Math.min(endMs, data.nowMs));
  return gap !== null && gap.anchor === anchor && gapCondition(data, gap) !== null;
}

/** A gap grows until the next session, so it held if it held just before that one (or now). */
function gapEndMs(data: FlagData, anchor: string): number | null {
  const sessions = data.calendar.sessions;
  let next;
  if (anchor.startsWith(GAP_START_PREFIX)) {
    const start = anchor.slice(GAP_START_PREFIX.length);
    next = sessions.find((s) => s.localDate >= start);
  } else {
    const index = sessions.findIndex((s) => s.session.id === anchor.slice(GAP_PREFIX.length));
    if (index < 0) return null;
    next = sessions[index + 1];
  }
  return next ? next.startMs - 1 : data.nowMs;
}
