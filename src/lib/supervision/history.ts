import type { Knex } from 'knex';
import type { Pause, PrescriptionVersion } from '../adherence/types';
import type { ClientRow, PauseRow, PrescriptionRow, RideRow } from '../db/tables';
import { flagThresholdsSchema, type FlagInput, type FlagSession, type FlagThresholds } from '../flags';

/** Everything the adherence and flag rules need about one client, read in one go. */
export interface ClientHistory {
  client: ClientRow;
  prescriptions: (PrescriptionVersion & { row: PrescriptionRow })[];
  pauses: Pause[];
  sessions: (FlagSession & { row: RideRow })[];
  thresholds: FlagThresholds;
}

export function activePauses(rows: PauseRow[]): Pause[] {
  return rows.filter((p) => !p.cancelled_at).map((p) => ({ from: p.starts_on, to: p.ends_on }));
}

export async function loadHistory(knex: Knex, client: ClientRow): Promise<ClientHistory> {
  const [prescriptions, pauses, rides, clinic] = await Promise.all([
    knex<PrescriptionRow>('prescriptions').where({ client_id: client.id }).orderBy('version'),
    knex<PauseRow>('pauses').where({ client_id: client.id }).orderBy('starts_on'),
    knex<RideRow>('rides').where({ client_id: client.id }).orderBy('started_at'),
    knex('clinics').where({ id: client.clinic_id }).first('flag_thresholds'),
  ]);
  return {
    client,
    prescriptions: prescriptions.map((p) => ({ effectiveFrom: p.effective_from, sessionsPerWeek: p.sessions_per_week, minutesPerSession: p.minutes_per_session, row: p })),
    pauses: activePauses(pauses),
    sessions: rides.map((r) => ({
      id: r.id,
      startedAt: r.started_at.toISOString(),
      durationS: r.duration_s,
      meanPowerW: r.mean_power_w,
      currentPerWattMaPerW: r.current_per_watt_ma_per_w,
      row: r,
    })),
    thresholds: flagThresholdsSchema.parse(clinic?.flag_thresholds ?? {}),
  };
}

export function flagInput(h: ClientHistory, now: Date): FlagInput {
  return {
    timeZone: h.client.time_zone,
    now: now.toISOString(),
    prescriptions: h.prescriptions.map(({ effectiveFrom, sessionsPerWeek, minutesPerSession }) => ({ effectiveFrom, sessionsPerWeek, minutesPerSession })),
    pauses: h.pauses,
    sessions: h.sessions.map(({ row: _, ...s }) => s),
    thresholds: h.thresholds,
  };
}
