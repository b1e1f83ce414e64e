import type { Knex } from 'knex';
import { accessClient } from '../auth/access';
import { auditAs, type RequestContext } from '../auth/context';
import type { PrescriptionRow } from '../db/tables';
import { badRequest } from '../http/errors';
import { scheduleFlagEvaluation } from './flag-jobs';
import type { PrescriptionInput } from './prescription-rules';
import { careStatusOf } from '../care/care-status';
import type { ProgressionPlan } from '../care/progression';
import { isCleared, READINESS_LABELS } from '../care/readiness';
import { HttpError } from '../http/errors';
import { NOT_CLEARED_CAUTION } from '../checks/safety-text';

export function prescriptionView(row: PrescriptionRow & { created_by_name?: string }) {
  return {
    id: row.id,
    version: row.version,
    effectiveFrom: row.effective_from,
    sessionsPerWeek: row.sessions_per_week,
    minutesPerSession: row.minutes_per_session,
    warmupMinutes: row.warmup_minutes,
    targetCadenceRpm: row.target_cadence_rpm,
    cadenceToleranceRpm: row.cadence_tolerance_rpm,
    resistance: row.resistance,
    channels: row.channels,
    notes: row.notes,
    progression: (row.progression ?? null) as ProgressionPlan | null,
    notClearedReason: row.not_cleared_reason ?? null,
    createdBy: { userId: row.created_by, name: row.created_by_name ?? null },
    createdAt: row.created_at.toISOString(),
  };
}
export type PrescriptionView = ReturnType<typeof prescriptionView>;

/** Every version of a client's prescription with its author, newest first. */
export async function prescriptionVersions(knex: Knex, clientId: string) {
  return knex('prescriptions as p')
    .join('users as u', 'u.id', 'p.created_by')
    .where('p.client_id', clientId)
    .orderBy('p.version', 'desc')
    .select('p.*', 'u.name as created_by_name');
}

/** The prescription in effect today (or the newest, when all start later) and every version, newest first. */
export async function readPrescription(ctx: RequestContext, clientId: string, today: string) {
  const client = await accessClient(ctx, clientId, 'read', 'prescription.view');
  const rows = await prescriptionVersions(ctx.knex, client.id);
  const current = rows.find((r) => r.effective_from <= today) ?? null;
  const upcoming = rows.filter((r) => r.effective_from > today);
  return {
    current: current ? prescriptionView(current) : null,
    upcoming: upcoming.map(prescriptionView),
    history: rows.map(prescriptionView),
  };
}

/**
 * Saving always creates a new version; earlier versions stay as they were.
 * For a client who is not cleared (screening and a current clearance) the
 * caller must confirm with a reason, which is kept with the version and in
 * the audit log; without one the answer is 409 `not_cleared`.
 */
export async function savePrescription(ctx: RequestContext, clientId: string, input: PrescriptionInput, audited: Record<string, unknown> = {}) {
  const client = await accessClient(ctx, clientId, 'manage', 'prescription.change');
  const { readiness } = await careStatusOf(ctx.knex, client);
  const cleared = isCleared(readiness);
  if (!cleared && !input.notClearedReason) {
    throw new HttpError(409, 'not_cleared', `${READINESS_LABELS[readiness]}. ${NOT_CLEARED_CAUTION}`, {
      readiness,
      fields: [{ path: 'notClearedReason', message: 'Reason: say why the program goes on without a current clearance.' }],
    });
  }
  const reason = cleared ? null : input.notClearedReason!;
  const row = await ctx.knex.transaction(async (trx) => {
    await trx.raw('SELECT pg_advisory_xact_lock(hashtext(?))', [`prescription:${client.id}`]);
    const latest = await trx<PrescriptionRow>('prescriptions').where({ client_id: client.id }).orderBy('version', 'desc').first();
    if (latest && input.effectiveFrom < latest.effective_from) {
      throw badRequest(`Effective date: the new version cannot start before the current one (${latest.effective_from}).`, {
        fields: [{ path: 'effectiveFrom', message: `Choose ${latest.effective_from} or later.` }],
      });
    }
    const [created] = await trx<PrescriptionRow>('prescriptions')
      .insert({
        client_id: client.id,
        version: (latest?.version ?? 0) + 1,
        effective_from: input.effectiveFrom,
        sessions_per_week: input.sessionsPerWeek,
        minutes_per_session: input.minutesPerSession,
        warmup_minutes: input.warmupMinutes ?? null,
        target_cadence_rpm: input.targetCadenceRpm ?? null,
        cadence_tolerance_rpm: input.cadenceToleranceRpm ?? null,
        resistance: input.resistance ?? null,
        channels: JSON.stringify(input.channels ?? {}) as never,
        notes: input.notes ?? null,
        progression: input.progression ? (JSON.stringify(input.progression) as never) : null,
        not_cleared_reason: reason,
        created_by: ctx.viewer.userId,
      })
      .returning('*');
    await auditAs(ctx, { action: 'prescription.version_created', clinicId: client.clinic_id, clientId: client.id, recordType: 'prescription', recordId: created.id, detail: { version: created.version, ...(reason ? { readiness, notClearedReason: reason } : {}), ...audited } }, trx);
    return created;
  });
  await scheduleFlagEvaluation(client.id, 0);
  return prescriptionView({ ...row, created_by_name: ctx.viewer.name });
}
