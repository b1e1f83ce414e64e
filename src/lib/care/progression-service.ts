// Progression proposals: judged after the flags, whenever a client's rides or
// days change (the flag job), and decided by the therapist. Accepting makes a
// new prescription version that starts the next Monday in the client's zone.
import { z } from 'zod';
import { computeAdherence } from '../adherence';
import type { RequestContext } from '../auth/context';
import { lock, scope, type Db } from '../data';
import type { ClientRow, PrescriptionRow } from '../db/tables';
import { forbidden, HttpError } from '../http/errors';
import { loadHistory } from '../supervision/history';
import { savePrescription } from '../supervision/prescriptions';
import type { PrescriptionInput } from '../supervision/prescription-rules';
import { addDays, localDate } from '../time/local-date';
import { calendarDate, line } from '../validation/fields';
import { judgeProgression, nextMonday, type ProgressionJudgement, type ProgressionPlan } from './progression';

/** Judges a client now and keeps one open proposal at most: the newest evidence wins. */
export async function refreshProgression(knex: Db, clientId: string, now = new Date()): Promise<ProgressionJudgement | null> {
  const client = await knex<ClientRow>('clients').where({ id: clientId }).whereNull('archived_at').first();
  if (!client) return null;
  const h = await loadHistory(knex, client);
  const today = localDate(now, client.time_zone);
  const rows = h.prescriptions.map((p) => p.row);
  const current = [...rows].reverse().find((r) => r.effective_from <= today);
  const upcoming = rows.some((r) => r.effective_from > today);
  const openIds = async () => knex('progression_proposals').where({ client_id: client.id, state: 'open' }).pluck('id');
  if (!current || upcoming || !current.progression) {
    await supersede(knex, await openIds());
    return null;
  }
  const adherence = computeAdherence({ timeZone: client.time_zone, now: now.toISOString(), prescriptions: h.prescriptions, pauses: h.pauses, sessions: h.sessions, countThresholdPct: h.thresholds.countThresholdPct, weeks: 2 });
  const lastWeek = adherence.weeks[0];
  const sunday = addDays(lastWeek.monday, 6);
  const dated = h.sessions.map((s) => ({ day: localDate(s.startedAt, client.time_zone), cpw: s.currentPerWattMaPerW }));
  const inWeek = dated.filter((s) => s.day >= lastWeek.monday && s.day <= sunday && s.cpw !== null).map((s) => s.cpw!);
  const before = dated.filter((s) => s.day < lastWeek.monday && s.cpw !== null).map((s) => s.cpw!).slice(-h.thresholds.baselineSessions);
  const urgent = await knex('flags').where({ client_id: client.id, state: 'open', severity: 'urgent' }).count<{ n: string }[]>('id as n');
  const judgement = judgeProgression({
    version: { id: current.id, effectiveFrom: current.effective_from, minutesPerSession: current.minutes_per_session, resistance: current.resistance === null ? null : Number(current.resistance), progression: current.progression as ProgressionPlan },
    lastWeek: { isoWeek: lastWeek.isoWeek, monday: lastWeek.monday, prescribed: lastWeek.prescribed, counted: lastWeek.counted, paused: lastWeek.paused },
    openUrgentFlags: Number(urgent[0].n),
    currentPerWatt: { lastWeek: inWeek, before },
    currentRiseLimitPct: h.thresholds.currentRiseReviewPct,
  });
  if (!judgement.ready) {
    await supersede(knex, await openIds());
    return judgement;
  }
  await knex.transaction(async (trx) => {
    await lock(trx, `progression:${client.id}`);
    const [made] = await trx('progression_proposals')
      .insert({ clinic_id: client.clinic_id, client_id: client.id, prescription_id: current.id, iso_week: lastWeek.isoWeek, proposed: JSON.stringify(judgement.proposed), evidence: JSON.stringify(judgement.evidence) })
      .onConflict(['prescription_id', 'iso_week'])
      .ignore()
      .returning('id');
    if (made) {
      await supersede(trx, (await trx('progression_proposals').where({ client_id: client.id, state: 'open' }).whereNot({ id: made.id }).pluck('id')) as string[]);
      await trx('audit_log').insert({ actor_user_id: null, action: 'progression.proposed', clinic_id: client.clinic_id, client_id: client.id, record_type: 'progression', record_id: made.id, detail: JSON.stringify({ isoWeek: lastWeek.isoWeek, proposed: judgement.proposed }) });
    }
  });
  return judgement;
}

async function supersede(knex: Db, ids: string[]) {
  if (ids.length) await knex('progression_proposals').whereIn('id', ids).where({ state: 'open' }).update({ state: 'superseded', decided_at: knex.fn.now() });
}

function proposalView(row: {
  id: string;
  client_id: string;
  prescription_id: string;
  iso_week: string;
  proposed: Record<string, number>;
  evidence: Record<string, unknown>;
  state: string;
  decided_by: string | null;
  decided_by_name?: string | null;
  decided_at: Date | null;
  result_prescription_id: string | null;
  created_at: Date;
}) {
  return {
    id: row.id,
    clientId: row.client_id,
    prescriptionId: row.prescription_id,
    isoWeek: row.iso_week,
    proposed: row.proposed,
    evidence: row.evidence,
    state: row.state,
    decidedBy: row.decided_by ? { userId: row.decided_by, name: row.decided_by_name ?? null } : null,
    decidedAt: row.decided_at?.toISOString() ?? null,
    resultPrescriptionId: row.result_prescription_id,
    proposedAt: row.created_at.toISOString(),
  };
}

/** The "ready to progress" list beside triage: open proposals of the caller's clinics. */
export async function readyToProgress(ctx: RequestContext) {
  if (!ctx.viewer.memberships.length) throw forbidden('The list of riders ready to progress is for clinic staff.');
  const s = scope(ctx);
  const rows = await s
    .progressions('p')
    .join('clients as c', 'c.id', 'p.client_id')
    .join(s.prescriptions().as('rx'), 'rx.id', 'p.prescription_id')
    .where('p.state', 'open')
    .whereNull('c.archived_at')
    .orderBy('p.created_at')
    .select('p.*', 'c.display_name', 'c.clinic_id as client_clinic_id', 'c.time_zone', 'rx.minutes_per_session', 'rx.resistance', 'rx.sessions_per_week');
  await s.listed('progressions.view', rows.map((r) => ({ id: r.client_id, clinic_id: r.client_clinic_id })));
  return rows.map((r) => ({
    ...proposalView(r),
    clientName: r.display_name as string,
    current: { minutesPerSession: r.minutes_per_session as number, resistance: r.resistance === null ? null : Number(r.resistance), sessionsPerWeek: r.sessions_per_week as number },
    startsOn: nextMonday(localDate(new Date(), r.time_zone)),
  }));
}

/** A client's proposals, newest first (staff). */
export async function clientProgressions(ctx: RequestContext, clientId: string) {
  const client = await scope(ctx).client(clientId, 'manage', 'progressions.list');
  const rows = await client.db('progression_proposals as p').leftJoin('users as u', 'u.id', 'p.decided_by').orderBy('p.created_at', 'desc').limit(20).select('p.*', 'u.name as decided_by_name');
  return { proposals: rows.map(proposalView), startsOn: nextMonday(localDate(new Date(), client.row.time_zone)) };
}

export const decisionSchema = z
  .object({
    action: z.enum(['accept', 'dismiss'], { errorMap: () => ({ message: 'Action: accept or dismiss.' }) }),
    /** An edited step instead of the proposed one. */
    minutesPerSession: z.number({ invalid_type_error: 'Minutes per session: enter a number.' }).int('Minutes per session: enter whole minutes.').min(10, 'Minutes per session: 10–60.').max(60, 'Minutes per session: 10–60.').optional(),
    resistance: z.number({ invalid_type_error: 'Resistance: enter a number.' }).min(0, 'Resistance: 0–10.').max(10, 'Resistance: 0–10.').optional(),
    effectiveFrom: calendarDate('Effective date').optional(),
    note: line(z.string().trim().max(500, 'Note: at most 500 characters.'), 'Note').optional(),
    notClearedReason: line(z.string().trim().min(1, 'Reason: say why the program goes on without a current clearance.').max(500, 'Reason: at most 500 characters.'), 'Reason').optional(),
  })
  .strict();

/** Accept (a new version from the next Monday; the values may be edited) or dismiss an open proposal. */
export async function decideProgression(ctx: RequestContext, id: string, input: z.infer<typeof decisionSchema>) {
  const { row, client } = await scope(ctx).record('progression', id, 'manage', 'progression.decide');
  const proposals = () => client.db('progression_proposals');
  if (row.state !== 'open') throw new HttpError(409, 'already_decided', `This proposal was ${row.state} already; the client page shows the current one.`);
  if (input.action === 'dismiss') {
    const n = await proposals().where({ id, state: 'open' }).update({ state: 'dismissed', decided_by: ctx.viewer.userId, decided_at: client.db.fn.now() });
    if (!n) throw new HttpError(409, 'already_decided', 'Someone decided this proposal a moment ago; reload to see what they chose.');
    await client.audit({ action: 'progression.dismiss', recordType: 'progression', recordId: id, detail: { note: input.note ?? null } });
    return { proposal: proposalView({ ...row, state: 'dismissed', decided_by: ctx.viewer.userId, decided_by_name: ctx.viewer.name, decided_at: new Date() }), prescription: null };
  }
  const base: PrescriptionRow | undefined = await client.db<PrescriptionRow>('prescriptions').where({ id: row.prescription_id }).first();
  const latest: PrescriptionRow | undefined = await client.db<PrescriptionRow>('prescriptions').orderBy('version', 'desc').first();
  if (!base || !latest || latest.id !== base.id) throw new HttpError(409, 'prescription_changed', 'The prescription has changed since this was proposed; it no longer applies.');
  const proposed = row.proposed as { minutesPerSession?: number; resistance?: number };
  const minutes = input.minutesPerSession ?? proposed.minutesPerSession ?? base.minutes_per_session;
  const resistance = input.resistance ?? proposed.resistance ?? (base.resistance === null ? undefined : Number(base.resistance));
  const edited = input.minutesPerSession !== undefined || input.resistance !== undefined || input.effectiveFrom !== undefined;
  const claimed = await proposals().where({ id, state: 'open' }).update({ state: 'accepted', decided_by: ctx.viewer.userId, decided_at: client.db.fn.now() });
  if (!claimed) throw new HttpError(409, 'already_decided', 'Someone decided this proposal a moment ago; reload to see what they chose.');
  const next: PrescriptionInput = {
    sessionsPerWeek: base.sessions_per_week,
    minutesPerSession: minutes,
    warmupMinutes: base.warmup_minutes ?? undefined,
    targetCadenceRpm: base.target_cadence_rpm === null ? undefined : Number(base.target_cadence_rpm),
    cadenceToleranceRpm: base.cadence_tolerance_rpm === null ? undefined : Number(base.cadence_tolerance_rpm),
    resistance,
    channels: base.channels as PrescriptionInput['channels'],
    notes: base.notes ?? undefined,
    progression: base.progression as ProgressionPlan,
    effectiveFrom: input.effectiveFrom ?? nextMonday(localDate(new Date(), client.row.time_zone)),
    notClearedReason: input.notClearedReason,
  };
  let saved;
  try {
    saved = await savePrescription(ctx, client.id, next, { progressionProposalId: id, edited });
  } catch (err) {
    await proposals().where({ id, state: 'accepted' }).whereNull('result_prescription_id').update({ state: 'open', decided_by: null, decided_at: null });
    throw err;
  }
  await proposals().where({ id }).update({ result_prescription_id: saved.id });
  await client.audit({ action: 'progression.accept', recordType: 'progression', recordId: id, detail: { edited, prescriptionId: saved.id, note: input.note ?? null } });
  return { proposal: proposalView({ ...row, state: 'accepted', decided_by: ctx.viewer.userId, decided_by_name: ctx.viewer.name, decided_at: new Date(), result_prescription_id: saved.id }), prescription: saved };
}
