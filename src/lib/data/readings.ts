// What a list needs of each of its clients, in one query whatever their
// number: the program (prescriptions, pauses, the clinic's thresholds), the
// state of the stored weeks and those weeks from `from`, the last session
// and, when asked, the recent sessions' power (src/lib/supervision/adherence-store.ts
// reads it). PostgreSQL gathers each client's rows, so it is written as SQL;
// it reads only clients the holder of `db` may read: the ids are narrowed by
// `db`'s own rule first.
import { connectionOf, type Db } from './db';

export interface ProgramRowsOptions {
  from: string;
  now: Date;
  /** The recent sessions (start, mean power) after this instant and not after `now`; none when absent. */
  sessionsSince?: Date;
}

export async function programRows(db: Db, ids: string[], { from, now, sessionsSince }: ProgramRowsOptions): Promise<unknown[]> {
  const readable: string[] = ids.length ? await db('clients').whereIn('id', ids).pluck('id') : [];
  if (!readable.length) return [];
  const recent = sessionsSince
    ? `, (SELECT json_agg(json_build_array(floor(extract(epoch FROM r.started_at) * 1000), r.mean_power_w) ORDER BY r.started_at)
            FROM rides r WHERE r.client_id = c.id AND r.started_at > :since AND r.started_at <= :now) AS recent`
    : '';
  const { rows } = await connectionOf(db).raw<{ rows: unknown[] }>(
    `SELECT c.id, c.time_zone, k.flag_thresholds, s.input_seq::text, s.source_seq::text, s.count_threshold_pct, s.first_monday, s.through_monday,
       (SELECT json_agg(json_build_array(p.effective_from, p.sessions_per_week, p.minutes_per_session) ORDER BY p.version) FROM prescriptions p WHERE p.client_id = c.id) AS prescriptions,
       (SELECT json_agg(json_build_array(p.starts_on, p.ends_on)) FROM pauses p WHERE p.client_id = c.id AND p.cancelled_at IS NULL) AS pauses,
       (SELECT json_agg(json_build_array(w.monday, w.sessions, w.counted, w.short, w.prescribed, w.met, w.paused, w.has_prescription, w.run))
          FROM adherence_weeks w WHERE w.client_id = c.id AND (w.monday >= :from OR w.monday = s.through_monday)) AS weeks,
       (SELECT r.started_at FROM rides r WHERE r.client_id = c.id ORDER BY r.started_at DESC LIMIT 1) AS last_at
       ${recent}
     FROM clients c JOIN clinics k ON k.id = c.clinic_id LEFT JOIN adherence_state s ON s.client_id = c.id
     WHERE c.id = ANY(CAST(:ids AS uuid[]))`,
    { ids: readable, from, now, since: sessionsSince ?? now },
  );
  return rows;
}
