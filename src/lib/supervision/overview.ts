// The per-client figures that triage and the caseload show: adherence, streak,
// last session and power trend, computed from the same history the flags use.
import { computeAdherence } from '../adherence';
import { roundTo } from '../analytics/round';
import { powerTrendPerWeek, POWER_TREND_WEEKS } from '../analytics/trend';
import type { Db } from '../data/db';
import type { ClientRow } from '../db/tables';
import { readClients } from './adherence-store';
import type { ClientHistory } from './history';

export interface ClientOverview {
  lastSessionAt: string | null;
  adherence4wPct: number | null;
  streakWeeks: number;
  powerTrendWPerWeek: number | null;
}

export function overviewOf(h: ClientHistory, now: Date, weeks = 12) {
  const adherence = computeAdherence({
    timeZone: h.client.time_zone,
    now: now.toISOString(),
    prescriptions: h.prescriptions,
    pauses: h.pauses,
    sessions: h.sessions,
    countThresholdPct: h.thresholds.countThresholdPct,
    weeks,
  });
  const last = h.sessions[h.sessions.length - 1];
  const overview: ClientOverview = {
    lastSessionAt: last?.startedAt ?? null,
    adherence4wPct: adherence.adherence4wPct,
    streakWeeks: adherence.streakWeeks,
    powerTrendWPerWeek: roundTrend(powerTrendPerWeek(h.sessions, now.toISOString())),
  };
  return { overview, adherence };
}

const roundTrend = (v: number | null) => (v === null ? null : roundTo(v, 2));

/**
 * `overviewOf`'s figures for several clients in one query whatever their
 * history (adherence-store.ts, readClients): adherence and streak from the
 * stored weeks, the last session by the (client, start) index, the power
 * trend from the sessions of its own eight weeks only.
 */
export async function figuresOf(db: Db, clients: Pick<ClientRow, 'id'>[], now: Date): Promise<Map<string, ClientOverview>> {
  const read = await readClients(db, clients, now, 1, { sessionsSince: new Date(now.getTime() - POWER_TREND_WEEKS * 7 * 86_400_000) });
  const out = new Map<string, ClientOverview>();
  for (const [id, r] of read) {
    out.set(id, {
      lastSessionAt: r.lastSessionAt,
      adherence4wPct: r.adherence.adherence4wPct,
      streakWeeks: r.adherence.streakWeeks,
      powerTrendWPerWeek: roundTrend(powerTrendPerWeek(r.recent, now.toISOString())),
    });
  }
  return out;
}
