import { prescriptionTimeline, sessionStatus } from '../adherence';
import type { ClientHistory } from '../supervision/history';
import { localDate } from '../time/local-date';
import type { Pause as RiderPause } from '../rider/pauses';
import type { RiderSession } from '../rider/types';

export function riderSessions(h: ClientHistory): RiderSession[] {
  const timeline = prescriptionTimeline(h.prescriptions);
  return h.sessions.map((s) => ({
    id: s.id,
    startedAt: s.startedAt,
    activeS: s.row.active_s,
    meanPowerW: s.meanPowerW,
    peakPower5sW: s.row.peak_power_5s_w,
    distanceM: s.row.distance_m,
    counted: sessionStatus(s.durationS, timeline.versionOn(localDate(s.startedAt, h.client.time_zone)), h.thresholds.countThresholdPct) !== 'short',
  }));
}

export const riderPauses = (h: ClientHistory): RiderPause[] => h.pauses.map((p) => ({ start: p.from, end: p.to }));

/** The program's first day: the client's program start, else the first prescription, else the first session. */
export function programStartOf(h: ClientHistory, today: string): string {
  return h.client.program_start ?? h.prescriptions[0]?.effectiveFrom ?? h.sessions[0]?.startedAt.slice(0, 10) ?? today;
}
