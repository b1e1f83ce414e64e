import type { Db } from '../data/db';
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

/**
 * `rules`: only the columns the adherence and flag rules read (the flag
 * judgement and the stored weeks run for every client every day; a ride's
 * channels and warnings are the larger part of its row).
 */
export async function loadHistory(db: Db, client: ClientRow, { rules = false }: { rules?: boolean } = {}): Promise<ClientHistory> {
  return (await loadHistories(db, [client], { rules }))[0];
}

const RULE_COLUMNS = ['id', 'client_id', 'started_at', 'duration_s', 'mean_power_w', 'current_per_watt_ma_per_w'] as const;

/**
 * The histories of several clients in four queries, whatever their number:
 * triage, the caseload and the hourly mail judge a whole clinic at once.
 */
export async function loadHistories(db: Db, clients: ClientRow[], { rules = false }: { rules?: boolean } = {}): Promise<ClientHistory[]> {
  if (!clients.length) return [];
  const ids = clients.map((c) => c.id);
  // One after another, not in parallel: the flag judge passes a transaction,
  // which is one connection, and pg refuses overlapping queries on one
  // connection from its next major on.
  const prescriptions = await db<PrescriptionRow>('prescriptions').whereIn('client_id', ids).orderBy('version');
  const pauses = await db<PauseRow>('pauses').whereIn('client_id', ids).orderBy('starts_on');
  const rides: RideRow[] = await db<RideRow>('rides')
    .whereIn('client_id', ids)
    .orderBy('started_at')
    .modify((q) => {
      if (rules) q.select(RULE_COLUMNS);
    });
  const clinics = await db('clinics').whereIn('id', [...new Set(clients.map((c) => c.clinic_id))]).select('id', 'flag_thresholds');
  const thresholds = new Map(clinics.map((c) => [c.id as string, flagThresholdsSchema.parse(c.flag_thresholds ?? {})]));
  // Grouped once, so a clinic-wide read stays linear in its rows.
  const prescriptionsOf = byClient(prescriptions);
  const pausesOf = byClient(pauses);
  const ridesOf = byClient(rides);
  return clients.map((client) => ({
    client,
    prescriptions: (prescriptionsOf.get(client.id) ?? []).map((p) => ({
      effectiveFrom: p.effective_from,
      sessionsPerWeek: p.sessions_per_week,
      minutesPerSession: p.minutes_per_session,
      row: p,
    })),
    pauses: activePauses(pausesOf.get(client.id) ?? []),
    sessions: (ridesOf.get(client.id) ?? []).map(sessionOf),
    thresholds: thresholds.get(client.clinic_id) ?? flagThresholdsSchema.parse({}),
  }));
}

/** A stored ride as the adherence and flag rules take it (the row read may hold only some columns). */
export function sessionOf(r: Pick<RideRow, 'id' | 'started_at' | 'duration_s' | 'mean_power_w' | 'current_per_watt_ma_per_w'> & Partial<RideRow>): ClientHistory['sessions'][number] {
  return {
    id: r.id,
    startedAt: r.started_at.toISOString(),
    durationS: r.duration_s,
    meanPowerW: r.mean_power_w,
    currentPerWattMaPerW: r.current_per_watt_ma_per_w,
    row: r as RideRow,
  };
}

/** A client's program without the sessions: prescriptions, pauses and the clinic's thresholds (a handful of rows). */
export async function loadProgram(db: Db, client: ClientRow): Promise<Omit<ClientHistory, 'sessions'>> {
  const prescriptions = await db<PrescriptionRow>('prescriptions').where({ client_id: client.id }).orderBy('version');
  const pauses = await db<PauseRow>('pauses').where({ client_id: client.id }).orderBy('starts_on');
  const clinic = await db('clinics').where({ id: client.clinic_id }).first('flag_thresholds');
  return {
    client,
    prescriptions: prescriptions.map((p) => ({ effectiveFrom: p.effective_from, sessionsPerWeek: p.sessions_per_week, minutesPerSession: p.minutes_per_session, row: p })),
    pauses: activePauses(pauses),
    thresholds: flagThresholdsSchema.parse(clinic?.flag_thresholds ?? {}),
  };
}

/** Rows by their client, each list in the order the query gave. */
function byClient<T extends { client_id: string }>(rows: T[]): Map<string, T[]> {
  const out = new Map<string, T[]>();
  for (const row of rows) {
    const list = out.get(row.client_id);
    if (list) list.push(row);
    else out.set(row.client_id, [row]);
  }
  return out;
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
