// The per-client figures that triage and the caseload show: adherence, streak,
// last session and power trend, computed from the same history the flags use.
import { computeAdherence } from '../adherence';
import { roundTo } from '../analytics/round';
import { powerTrendPerWeek } from '../analytics/trend';
import type { Db } from '../data/db';
import type { ClientRow } from '../db/tables';
import type { ClientHistory } from './history';
import { loadHistories } from './history';

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

export async function overviews(db: Db, clients: ClientRow[], now: Date): Promise<Map<string, ClientOverview>> {
  const histories = await loadHistories(db, clients);
  return new Map(histories.map((h) => [h.client.id, overviewOf(h, now).overview]));
}
