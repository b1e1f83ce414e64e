import { computeAdherence, prescriptionTimeline } from '../adherence';
import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import { nextSessionDue } from '../rider/next-session';
import { progressLine } from '../rider/progress-line';
import { loadHistory } from '../supervision/history';
import { isoWeekOf } from '../time/iso-week';
import { localDate } from '../time/local-date';
import { programStartOf, riderPauses, riderSessions } from './sessions';

/** The rider's week: sessions against the prescription, streak, next session due, the latest ride and a progress line. */
export async function riderWeek(ctx: RequestContext, clientId: string, now = new Date()) {
  const grant = await scope(ctx).client(clientId, 'read', 'week.view');
  const client = grant.row;
  const h = await loadHistory(grant.db, client);
  const tz = client.time_zone;
  const today = localDate(now, tz);
  const week = isoWeekOf(today, tz);
  const adherence = computeAdherence({ timeZone: tz, now: now.toISOString(), prescriptions: h.prescriptions, pauses: h.pauses, sessions: h.sessions, countThresholdPct: h.thresholds.countThresholdPct, weeks: 1 });
  const current = adherence.weeks[adherence.weeks.length - 1];
  const version = prescriptionTimeline(h.prescriptions).versionOn(today);
  const thisWeek = h.sessions.filter((s) => {
    const d = localDate(s.startedAt, tz);
    return d >= week.monday && d <= week.sunday;
  });
  const countsFrom = version ? (version.minutesPerSession * 60 * h.thresholds.countThresholdPct) / 100 : null;
  const last = h.sessions[h.sessions.length - 1] ?? null;
  const next = nextSessionDue({ timeZone: tz, now, sessionsPerWeek: version?.sessionsPerWeek ?? 0, countedThisWeek: current.counted, lastSessionAt: last?.startedAt ?? null, pauses: riderPauses(h) });
  const activePause = h.pauses.find((p) => p.from <= today && p.to >= today) ?? null;
  const pauseRow = activePause ? await grant.db('pauses').where({ starts_on: activePause.from, ends_on: activePause.to }).whereNull('cancelled_at').first('reason') : null;
  const lastUpload = await grant.db('uploads').max('uploaded_at as at').first();
  const view = (s: (typeof h.sessions)[number]) => ({
    id: s.id,
    startedAt: s.startedAt,
    durationS: s.durationS,
    activeS: s.row.active_s,
    meanPowerW: s.meanPowerW,
    peakPower5sW: s.row.peak_power_5s_w,
    distanceM: s.row.distance_m,
  });
  return {
    clientId: client.id,
    name: client.display_name,
    timeZone: tz,
    isoWeek: week.isoWeek,
    prescribed: version ? current.prescribed : null,
    counted: current.counted,
    short: current.short,
    sessions: thisWeek.map((s) => ({ ...view(s), counted: countsFrom !== null && s.durationS >= countsFrom })),
    streakWeeks: adherence.streakWeeks,
    nextDue: { date: next.dueLocalDate, reason: next.reason },
    latest: last ? view(last) : null,
    progressLine: h.sessions.length ? progressLine(riderSessions(h), programStartOf(h, today), now, tz) : null,
    paused: activePause ? { from: activePause.from, to: activePause.to, reason: pauseRow?.reason ?? '' } : null,
    lastUploadAt: lastUpload?.at ? new Date(lastUpload.at).toISOString() : null,
  };
}
