import { z } from 'zod';
import { prescriptionTimeline, sessionStatus } from '../adherence';
import { localDate } from '../time/local-date';
import { usualLevel } from '../flags/metric-shift';
import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import { loadHistory, type ClientHistory } from './history';
import { overviewOf } from './overview';

export const adherenceQuerySchema = z.object({ weeks: z.coerce.number().int().min(1).max(104).default(12) });

export async function clientAdherence(ctx: RequestContext, clientId: string, weeks: number) {
  const client = await scope(ctx).client(clientId, 'read', 'adherence.view');
  const { adherence } = overviewOf(await loadHistory(client.db, client.row), new Date(), weeks);
  return {
    weeks: adherence.weeks.map((w) => ({ isoWeek: w.isoWeek, prescribed: w.prescribed, counted: w.counted, short: w.short, met: w.met, paused: w.paused })),
    streakWeeks: adherence.streakWeeks,
    adherence4wPct: adherence.adherence4wPct,
  };
}

/**
 * Per-session points for the client page's charts: mean power with the usual
 * level the power_drop rule would judge against with that session the latest
 * (usualLevel: the counted, unpaused sessions before the latest two) and the
 * review band below it, duration against the prescribed minutes, and current
 * per watt.
 */
export async function clientTrends(ctx: RequestContext, clientId: string) {
  const client = await scope(ctx).client(clientId, 'read', 'trends.view');
  const h = await loadHistory(client.db, client.row);
  const { overview } = overviewOf(h, new Date());
  return { sessions: trendPointsOf(h), powerTrendWPerWeek: overview.powerTrendWPerWeek, thresholds: h.thresholds };
}

/** The per-session points of `clientTrends`, from a history already loaded (the report reads it once for everything). */
export function trendPointsOf(h: ClientHistory) {
  const t = h.thresholds;
  const timeline = prescriptionTimeline(h.prescriptions);
  const eligiblePower: number[] = [];
  return h.sessions.map((s) => {
    const day = localDate(s.startedAt, h.client.time_zone);
    const target = timeline.versionOn(day);
    const counted = sessionStatus(s.durationS, target, t.countThresholdPct) === 'counted';
    const paused = h.pauses.some((p) => p.from <= day && day <= p.to);
    if (counted && !paused && s.meanPowerW !== null) eligiblePower.push(s.meanPowerW);
    const baseline = usualLevel(eligiblePower, t);
    return {
      sessionId: s.id,
      startedAt: s.startedAt,
      meanPowerW: s.meanPowerW,
      baselineW: baseline,
      reviewBelowW: baseline === null ? null : baseline * (1 - t.powerDropReviewPct / 100),
      durationS: s.durationS,
      activeS: s.row.active_s,
      targetS: target ? target.minutesPerSession * 60 : null,
      counted,
      currentPerWattMaPerW: s.currentPerWattMaPerW,
      enduranceRatioPct: s.row.endurance_ratio_pct ?? null,
    };
  });
}
