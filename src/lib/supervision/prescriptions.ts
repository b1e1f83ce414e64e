import type { Knex } from 'knex';
import { accessClient } from '../auth/access';
import { auditAs, type RequestContext } from '../auth/context';
import type { PrescriptionRow } from '../db/tables';
import { badRequest, conflict } from '../http/errors';
import { scheduleFlagEvaluation } from './flag-jobs';
import { sameAsStored, type PrescriptionInput } from './prescription-rules';

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

/** Saving always creates a new version; earlier versions stay as they were. */
export async function savePrescription(ctx: RequestContext, clientId: string, input: PrescriptionInput) {
  const client = await accessClient(ctx, clientId, 'manage', 'prescription.change');
  const row = await ctx.knex.transaction(async (trx) => {
    await trx.raw('SELECT pg_advisory_xact_lock(hashtext(?))', [`prescription:${client.id}`]);
    const latest = await trx<PrescriptionRow>('prescriptions').where({ client_id: client.id }).orderBy('version', 'desc').first();
    if (latest && input.effectiveFrom < latest.effective_from) {
      throw badRequest(`Effective date: the new version cannot start before the current one (${latest.effective_from}).`, {
        fields: [{ path: 'effectiveFrom', message: `Choose ${latest.effective_from} or later.` }],
      });
    }
    if (latest && sameAsStored(input, latest)) {
      throw conflict('unchanged', `Nothing differs from version ${latest.version}: change at least one value before saving a new version.`);
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
        created_by: ctx.viewer.userId,
      })
      .returning('*');
    await auditAs(ctx, { action: 'prescription.version_created', clinicId: client.clinic_id, clientId: client.id, recordType: 'prescription', recordId: created.id, detail: { version: created.version } }, trx);
    return created;
  });
  await scheduleFlagEvaluation(client.id, 0);
  return prescriptionView({ ...row, created_by_name: ctx.viewer.name });
}
