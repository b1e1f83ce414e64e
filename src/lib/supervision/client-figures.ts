import { z } from 'zod';
import { prescriptionTimeline, sessionStatus } from '../adherence';
import { isoWeekOf, weeksEndingAt } from '../time/iso-week';
import { localDate } from '../time/local-date';
import { startOfLocalDay } from '../time/zoned';
import { usualLevel } from '../flags/metric-shift';
import { powerTrendPerWeek, POWER_TREND_WEEKS } from '../analytics/trend';
import { roundTo } from '../analytics/round';
import type { RequestContext } from '../auth/context';
import { scope, type ClientGrant } from '../data';
import type { RideRow } from '../db/tables';
import { adherenceOf } from './adherence-store';
import { loadHistory, loadProgram, sessionOf, type ClientHistory } from './history';
import { overviewOf } from './overview';

export const adherenceQuerySchema = z.object({ weeks: z.coerce.number().int().min(1).max(104).default(12) });

export async function clientAdherence(ctx: RequestContext, clientId: string, weeks: number) {
  const client = await scope(ctx).client(clientId, 'read', 'adherence.view');
  const adherence = (await adherenceOf(client.db, [client.row], new Date(), weeks)).get(client.id)!;
  return {
    weeks: adherence.weeks.map((w) => ({ isoWeek: w.isoWeek, prescribed: w.prescribed, counted: w.counted, short: w.short, met: w.met, paused: w.paused })),
    streakWeeks: adherence.streakWeeks,
    adherence4wPct: adherence.adherence4wPct,
  };
}

export const trendsQuerySchema = z.object({ weeks: z.coerce.number({ message: 'weeks: a whole number from 1 to 520.' }).int().min(1).max(520).optional() });

/**
 * Per-session points for the client page's charts: mean power with the usual
 * level the power_drop rule would judge against with that session the latest
 * (usualLevel: the counted, unpaused sessions before the latest two) and the
 * review band below it, duration against the prescribed minutes, and current
 * per watt. With `weeks`, only the sessions of the ISO weeks ending with the
 * current one (the page asks for half a year), read with just enough earlier
 * sessions for the first point's usual level; without it, the whole history.
 */
export async function clientTrends(ctx: RequestContext, clientId: string, weeks?: number) {
  const client = await scope(ctx).client(clientId, 'read', 'trends.view');
  const now = new Date();
  if (weeks === undefined) {
    const h = await loadHistory(client.db, client.row);
    const { overview } = overviewOf(h, now);
    return { sessions: trendPointsOf(h), powerTrendWPerWeek: overview.powerTrendWPerWeek, thresholds: h.thresholds };
  }
  const program = await loadProgram(client.db, client.row);
  const zone = client.row.time_zone;
  const from = new Date(startOfLocalDay(weeksEndingAt(isoWeekOf(localDate(now, zone), zone), weeks)[0].monday, zone));
  const shown = (await ridesOf(client).where('started_at', '>=', from).orderBy('started_at')).map(sessionOf);
  const h: ClientHistory = { ...program, sessions: shown };
  const rule = trendRule(h);
  // Earlier eligible sessions, newest first, until the usual level of the first point shown is settled.
  const need = h.thresholds.baselineSessions + 2;
  const prior: number[] = [];
  for (let offset = 0; prior.length < need; offset += PRIOR_PAGE) {
    const page = (await ridesOf(client).where('started_at', '<', from).orderBy('started_at', 'desc').offset(offset).limit(PRIOR_PAGE)).map(sessionOf);
    for (const s of page) if (prior.length < need && rule.eligible(s)) prior.unshift(s.meanPowerW!);
    if (page.length < PRIOR_PAGE) break;
  }
  const trendFrom = new Date(now.getTime() - POWER_TREND_WEEKS * 7 * 86_400_000);
  const trendSessions = trendFrom >= from ? shown : (await ridesOf(client).where('started_at', '>', trendFrom).orderBy('started_at')).map(sessionOf);
  const trend = powerTrendPerWeek(trendSessions, now.toISOString());
  return { sessions: trendPointsOf(h, prior), powerTrendWPerWeek: trend === null ? null : roundTo(trend, 2), thresholds: h.thresholds };
}

const PRIOR_PAGE = 50;

const ridesOf = (client: ClientGrant) =>
  client.db<RideRow>('rides')
    .select('id', 'started_at', 'duration_s', 'active_s', 'mean_power_w', 'current_per_watt_ma_per_w');

/** Which prescription a session was judged against, whether it counted, and whether its power enters the usual level. */
function trendRule(h: Pick<ClientHistory, 'client' | 'prescriptions' | 'pauses' | 'thresholds'>) {
  const timeline = prescriptionTimeline(h.prescriptions);
  const t = h.thresholds;
  const judge = (s: ClientHistory['sessions'][number]) => {
    const day = localDate(s.startedAt, h.client.time_zone);
    const target = timeline.versionOn(day);
    const counted = sessionStatus(s.durationS, target, t.countThresholdPct) === 'counted';
    const paused = h.pauses.some((p) => p.from <= day && day <= p.to);
    return { target, counted, eligible: counted && !paused && s.meanPowerW !== null };
  };
  return { judge, eligible: (s: ClientHistory['sessions'][number]) => judge(s).eligible };
}

/**
 * The per-session points of `clientTrends`, from a history already loaded
 * (the report reads it once for everything). `prior`: the mean power of the
 * eligible sessions before the first one given, oldest first.
 */
export function trendPointsOf(h: ClientHistory, prior: number[] = []) {
  const t = h.thresholds;
  const rule = trendRule(h);
  const eligiblePower: number[] = [...prior];
  return h.sessions.map((s) => {
    const { target, counted, eligible } = rule.judge(s);
    if (eligible) eligiblePower.push(s.meanPowerW!);
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
