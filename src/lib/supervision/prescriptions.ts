import type { RequestContext } from '../auth/context';
import { scope, type Db } from '../data';
import type { PrescriptionRow } from '../db/tables';
import { badRequest, conflict } from '../http/errors';
import { localDate } from '../time/local-date';
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
export async function prescriptionVersions(db: Db, clientId: string) {
  return db('prescriptions as p')
    .join('users as u', 'u.id', 'p.created_by')
    .where('p.client_id', clientId)
    .orderBy('p.version', 'desc')
    .select('p.*', 'u.name as created_by_name');
}

/** The prescription in effect on `today` (by default the client's today; or the newest, when all start later) and every version, newest first. */
export async function readPrescription(ctx: RequestContext, clientId: string, today?: string) {
  const client = await scope(ctx).client(clientId, 'read', 'prescription.view');
  today ??= localDate(new Date(), client.row.time_zone);
  const rows = await prescriptionVersions(client.db, client.id);
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
  const client = await scope(ctx).client(clientId, 'manage', 'prescription.change');
  const row = await client.transaction(async (tx) => {
    await tx.lock(`prescription:${client.id}`);
    const latest: PrescriptionRow | undefined = await tx.db<PrescriptionRow>('prescriptions').orderBy('version', 'desc').first();
    if (latest && input.effectiveFrom < latest.effective_from) {
      throw badRequest(`Effective date: the new version cannot start before the current one (${latest.effective_from}).`, {
        fields: [{ path: 'effectiveFrom', message: `Choose ${latest.effective_from} or later.` }],
      });
    }
    if (latest && sameAsStored(input, latest)) {
      throw conflict('unchanged', `Nothing differs from version ${latest.version}: change at least one value before saving a new version.`);
    }
    const [created] = await tx.db<PrescriptionRow>('prescriptions')
      .insert({
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
    await tx.audit({ action: 'prescription.version_created', recordType: 'prescription', recordId: created.id, detail: { version: created.version } });
    return created;
  });
  await scheduleFlagEvaluation(client.id, 0);
  return prescriptionView({ ...row, created_by_name: ctx.viewer.name });
}
