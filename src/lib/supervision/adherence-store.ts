// The stored weeks of each client's program (migration adherence_weeks,
// src/lib/adherence/stored.ts): written by `refreshAdherence` off the request
// path (after a parse, a program change, in the hourly sweep and after a
// migration or seed), read by `adherenceOf` for lists and pages. A client
// whose stored weeks no longer match their data is read the old way, from the
// whole history, so the answer never depends on whether a refresh has run.
import { computeAdherence, type Adherence, type Pause, type PrescriptionVersion } from '../adherence';
import { adherenceFromStored, storedWeeksFrom, StoredWeeksMissing, weeksToStore, type StoredWeek } from '../adherence/stored';
import { programRows, type Db } from '../data';
import type { ClientRow } from '../db/tables';
import { isoWeekOf } from '../time/iso-week';
import { localDate } from '../time/local-date';
import { flagThresholdsSchema } from '../flags';
import { loadHistories, loadHistory } from './history';

interface StateRow {
  client_id: string;
  input_seq: string;
  source_seq: string | null;
  count_threshold_pct: number | null;
  first_monday: string | null;
  through_monday: string | null;
}

interface WeekRow {
  client_id: string;
  monday: string;
  sessions: number;
  counted: number;
  short: number;
  prescribed: number;
  met: boolean;
  paused: boolean;
  has_prescription: boolean;
  run: number;
}

const weekOf = (r: WeekRow): StoredWeek => ({
  monday: r.monday,
  sessions: r.sessions,
  counted: r.counted,
  short: r.short,
  prescribed: r.prescribed,
  met: r.met,
  paused: r.paused,
  hasPrescription: r.has_prescription,
  run: r.run,
});

/**
 * Works out and stores a client's weeks from their whole history. The
 * client's state row is locked first, so a change committed meanwhile either
 * is in the history read here or leaves the state stale (its trigger waits
 * for this lock and then raises `input_seq` past what is stored).
 */
export async function refreshAdherence(knex: Db, clientId: string, now = new Date()): Promise<void> {
  await knex.transaction(async (trx) => {
    await trx('adherence_state').insert({ client_id: clientId, input_seq: 0 }).onConflict('client_id').ignore();
    const state = await trx<StateRow>('adherence_state').where({ client_id: clientId }).forUpdate().first('input_seq');
    const client = await trx<ClientRow>('clients').where({ id: clientId }).first();
    if (!client || !state) return;
    const h = await loadHistory(trx, client, { rules: true });
    const stored = weeksToStore({
      timeZone: client.time_zone,
      prescriptions: h.prescriptions,
      pauses: h.pauses,
      countThresholdPct: h.thresholds.countThresholdPct,
      sessions: h.sessions,
      now: now.toISOString(),
    });
    await trx('adherence_weeks').where({ client_id: clientId }).delete();
    const rows = stored.weeks.map((w) => ({
      client_id: clientId,
      monday: w.monday,
      sessions: w.sessions,
      counted: w.counted,
      short: w.short,
      prescribed: w.prescribed,
      met: w.met,
      paused: w.paused,
      has_prescription: w.hasPrescription,
      run: w.run,
    }));
    for (let i = 0; i < rows.length; i += 500) await trx('adherence_weeks').insert(rows.slice(i, i + 500));
    await trx('adherence_state').where({ client_id: clientId }).update({
      source_seq: state.input_seq,
      count_threshold_pct: h.thresholds.countThresholdPct,
      first_monday: stored.first,
      through_monday: stored.through,
      refreshed_at: now,
    });
  });
}

/**
 * Refreshes a client's stored weeks unless they are up to date and reach the
 * current week already (the flag judgement at each client's midnight calls it:
 * six nights of seven there is nothing to do).
 */
export async function refreshAdherenceIfNeeded(knex: Db, clientId: string, now = new Date()): Promise<boolean> {
  const row = await knex('adherence_state as s')
    .join('clients as c', 'c.id', 's.client_id')
    .join('clinics as k', 'k.id', 'c.clinic_id')
    .where('s.client_id', clientId)
    .first('s.input_seq', 's.source_seq', 's.count_threshold_pct', 's.through_monday', 'c.time_zone', 'k.flag_thresholds');
  if (
    row &&
    row.source_seq !== null &&
    row.source_seq === row.input_seq &&
    row.count_threshold_pct === flagThresholdsSchema.parse(row.flag_thresholds ?? {}).countThresholdPct &&
    row.through_monday !== null &&
    row.through_monday >= isoWeekOf(localDate(now, row.time_zone), row.time_zone).monday
  ) {
    return false;
  }
  await refreshAdherence(knex, clientId, now);
  return true;
}

/**
 * Refreshes, a page at a time, the clients whose stored weeks are missing or
 * out of date (after a migration, a seed, a change of the clinic's count
 * threshold, or a refresh that failed). Returns how many it refreshed.
 */
export async function refreshStaleAdherence(knex: Db, { now = new Date(), pageSize = 100, maxClients = Infinity }: { now?: Date; pageSize?: number; maxClients?: number } = {}): Promise<number> {
  let done = 0;
  let after = '00000000-0000-0000-0000-000000000000';
  while (done < maxClients) {
    const page: { id: string }[] = await knex('clients as c')
      .join('clinics as k', 'k.id', 'c.clinic_id')
      .leftJoin('adherence_state as s', 's.client_id', 'c.id')
      .where('c.id', '>', after)
      .whereNull('c.archived_at')
      .where((q) =>
        q
          .whereNull('s.client_id')
          .orWhereRaw('s.source_seq IS DISTINCT FROM s.input_seq')
          .orWhereRaw(`s.count_threshold_pct IS DISTINCT FROM coalesce((k.flag_thresholds->>'countThresholdPct')::float8, ?)`, [flagThresholdsSchema.parse({}).countThresholdPct]),
      )
      .orderBy('c.id')
      .limit(Math.min(pageSize, maxClients - done))
      .select('c.id');
    if (!page.length) break;
    for (const { id } of page) await refreshAdherence(knex, id, now);
    done += page.length;
    after = page[page.length - 1].id;
  }
  return done;
}

/** What a list needs of one client besides adherence: the last session and the sessions of the power trend's weeks. */
export interface ClientReading {
  adherence: Adherence;
  prescriptions: PrescriptionVersion[];
  pauses: Pause[];
  lastSessionAt: string | null;
  /** Sessions started after `sessionsSince` and not after `now`, oldest first (only when asked for). */
  recent: { startedAt: string; meanPowerW: number | null }[];
}

interface ProgramRow {
  id: string;
  time_zone: string;
  flag_thresholds: unknown;
  input_seq: string | null;
  source_seq: string | null;
  count_threshold_pct: number | null;
  first_monday: string | null;
  through_monday: string | null;
  prescriptions: [string, number, number][] | null;
  pauses: [string, string][] | null;
  weeks: [string, number, number, number, number, boolean, boolean, boolean, number][] | null;
  last_at?: Date | null;
  recent?: [number, number | null][] | null;
}

const storedWeekOf = (w: NonNullable<ProgramRow['weeks']>[number]): StoredWeek => ({
  monday: w[0],
  sessions: w[1],
  counted: w[2],
  short: w[3],
  prescribed: w[4],
  met: w[5],
  paused: w[6],
  hasPrescription: w[7],
  run: w[8],
});

/**
 * Adherence (weeks ending with the current one, streak, four-week figure) of
 * several clients as of `now`, exactly as computeAdherence gives it from their
 * whole history, with their prescriptions, pauses and last session and,
 * with `sessionsSince`, their recent sessions. One query for any number of clients, each client's rows
 * gathered by PostgreSQL: their prescriptions and pauses, and of the stored
 * weeks only those shown and a few before. A client whose stored weeks are
 * out of date is read from the whole history instead.
 */
export async function readClients(
  knex: Db,
  clients: Pick<ClientRow, 'id'>[],
  now: Date,
  weeks: number,
  { sessionsSince }: { sessionsSince?: Date } = {},
): Promise<Map<string, ClientReading>> {
  const out = new Map<string, ClientReading>();
  if (!clients.length) return out;
  const nowIso = now.toISOString();
  // The earliest Monday any client's window starts on: Mondays differ by zone only around midnight.
  const from = storedWeeksFrom(new Date(now.getTime() - 86_400_000).toISOString(), 'UTC', weeks);
  const rows = (await programRows(knex, clients.map((c) => c.id), { from, now, sessionsSince })) as ProgramRow[];
  const thresholds = new Map<string, number>();
  const thresholdOf = (raw: unknown) => {
    const key = JSON.stringify(raw ?? {});
    let t = thresholds.get(key);
    if (t === undefined) thresholds.set(key, (t = flagThresholdsSchema.parse(raw ?? {}).countThresholdPct));
    return t;
  };
  const stale: string[] = [];
  for (const r of rows) {
    const countThresholdPct = thresholdOf(r.flag_thresholds);
    const fresh = r.source_seq !== null && r.source_seq === r.input_seq && r.count_threshold_pct === countThresholdPct;
    if (!fresh) {
      stale.push(r.id);
      continue;
    }
    const input = {
      timeZone: r.time_zone,
      now: nowIso,
      weeks,
      countThresholdPct,
      prescriptions: (r.prescriptions ?? []).map(([effectiveFrom, sessionsPerWeek, minutesPerSession]) => ({ effectiveFrom, sessionsPerWeek, minutesPerSession })),
      pauses: (r.pauses ?? []).map(([from, to]) => ({ from, to })),
    };
    const read = (stored: StoredWeek[]) =>
      adherenceFromStored({ ...input, stored: { first: r.first_monday, through: r.through_monday, weeks: new Map(stored.map((w) => [w.monday, w])) } });
    let adherence: Adherence;
    try {
      adherence = read((r.weeks ?? []).map(storedWeekOf));
    } catch (err) {
      if (!(err instanceof StoredWeeksMissing)) throw err;
      // A long pause or weeks that asked for nothing: the four judged weeks lie further back.
      adherence = read((await knex<WeekRow>('adherence_weeks').where({ client_id: r.id })).map(weekOf));
    }
    out.set(r.id, {
      adherence,
      prescriptions: input.prescriptions,
      pauses: input.pauses,
      lastSessionAt: r.last_at ? r.last_at.toISOString() : null,
      recent: (r.recent ?? []).map(([ms, meanPowerW]) => ({ startedAt: new Date(Number(ms)).toISOString(), meanPowerW })),
    });
  }

  if (stale.length) {
    const rows = await knex<ClientRow>('clients').whereIn('id', stale);
    for (const h of await loadHistories(knex, rows, { rules: true })) {
      const since = sessionsSince?.getTime() ?? Infinity;
      out.set(h.client.id, {
        prescriptions: h.prescriptions.map(({ effectiveFrom, sessionsPerWeek, minutesPerSession }) => ({ effectiveFrom, sessionsPerWeek, minutesPerSession })),
        pauses: h.pauses,
        adherence: computeAdherence({ timeZone: h.client.time_zone, now: nowIso, prescriptions: h.prescriptions, pauses: h.pauses, sessions: h.sessions, countThresholdPct: h.thresholds.countThresholdPct, weeks }),
        lastSessionAt: h.sessions.at(-1)?.startedAt ?? null,
        recent: h.sessions.filter((x) => Date.parse(x.startedAt) > since && Date.parse(x.startedAt) <= now.getTime()).map((x) => ({ startedAt: x.startedAt, meanPowerW: x.meanPowerW })),
      });
    }
  }
  return out;
}

/** `readClients`' adherence alone. */
export async function adherenceOf(knex: Db, clients: Pick<ClientRow, 'id'>[], now: Date, weeks: number): Promise<Map<string, Adherence>> {
  return new Map([...(await readClients(knex, clients, now, weeks))].map(([id, r]) => [id, r.adherence]));
}

function groupBy<T extends { client_id: string }>(rows: T[]): Map<string, T[]> {
  const out = new Map<string, T[]>();
  for (const row of rows) {
    const list = out.get(row.client_id);
    if (list) list.push(row);
    else out.set(row.client_id, [row]);
  }
  return out;
}
