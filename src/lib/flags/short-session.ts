// short_session. Rule from the Kinloop supervision issue; thresholds are
// clinic settings: shortSessionsOfLast3 (default two) of the last three
// sessions were short (info). Only sessions on prescribed, unpaused days are
// judged, and three are needed.
import { countingSeconds } from '../adherence/session-status';
import { sessionsAsOf, type Assessment, type FlagData } from './flag-data';
import { count, minutes } from '../format/numbers';
import { REASON_LOCALE } from './words';

export function assessShortSessions(data: FlagData, asOfMs: number): Assessment {
  const judged = sessionsAsOf(data, asOfMs).filter((s) => s.status !== 'unprescribed' && !s.paused);
  if (judged.length < 3) {
    return { condition: null, status: `only ${count(judged.length, 'session')} could be judged` };
  }
  const last = judged.slice(-3);
  const pct = data.thresholds.countThresholdPct;
  const versions = last.map((s) => data.calendar.timeline.versionOn(s.localDate)!);
  const rows = last.map((s, i) => ({
    id: s.session.id,
    startedAt: s.session.startedAt,
    durationS: s.session.durationS,
    countsFromS: countingSeconds(versions[i], pct),
    short: s.status === 'short',
  }));
  const short = rows.filter((r) => r.short);
  if (short.length < data.thresholds.shortSessionsOfLast3) {
    return { condition: null, status: `${short.length} of the last 3 sessions ${short.length === 1 ? 'was' : 'were'} short` };
  }
  const detail = rows
    .map((r, i) => (r.short ? `${minutes(r.durationS, REASON_LOCALE)} of ${minutes(versions[i].minutesPerSession * 60, REASON_LOCALE)}` : null))
    .filter((text) => text !== null)
    .join(' and ');
  const reason = `${short.length} of the last 3 sessions were shorter than ${pct} % of the prescribed time (${detail}).`;
  return {
    condition: {
      kind: 'short_session',
      severity: 'info',
      anchor: last[2].session.id,
      reason,
      evidence: {
        countThresholdPct: pct,
        sessions: rows,
        shortSessionIds: short.map((r) => r.id),
      },
    },
    status: reason,
  };
}
