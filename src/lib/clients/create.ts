import { IANAZone } from 'luxon';
import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope, type Db } from '../data';
import type { ClientRow } from '../db/tables';
import { badRequest } from '../http/errors';
import { calendarDate, line } from '../validation/fields';

export const clientInputSchema = z
  .object({
    name: line(z.string().trim().min(1, 'Name: enter the client’s name.').max(120), 'Name'),
    timezone: z.string().max(64).refine((tz) => IANAZone.isValidZone(tz), 'Time zone: choose a time zone such as Europe/London.'),
    dateOfBirth: calendarDate('Date of birth').optional(),
    diagnosis: z.enum(['sci', 'ms', 'stroke', 'cerebral_palsy', 'other']).optional(),
    injuryLevel: z.string().trim().regex(/^[CTLS]\d{1,2}$/i, 'Level: write it like C6, T4 or L1.').optional(),
    aisGrade: z.enum(['A', 'B', 'C', 'D', 'E']).optional(),
    adRisk: z.enum(['at_risk', 'not_at_risk', 'unknown']).optional(),
    bodyMassKg: z.number().min(20, 'Body mass: enter 20–300 kg.').max(300, 'Body mass: enter 20–300 kg.').optional(),
    programStart: calendarDate('Program start').optional(),
    primaryTherapistId: z.string().uuid().optional(),
    clinicId: z.string().uuid().optional(),
  })
  .strict();

/** A primary therapist is a therapist or admin of the client's own clinic whose account is active; anything else is a 400 on the field. */
export async function checkPrimaryTherapist(db: Db, clinicId: string, userId: string | null | undefined): Promise<void> {
  if (!userId) return;
  const member = await db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where({ 'm.clinic_id': clinicId, 'm.user_id': userId })
    .whereIn('m.role', ['therapist', 'admin'])
    .whereNull('u.disabled_at')
    .first('m.id');
  if (!member) {
    const message = 'Primary therapist: choose a therapist or administrator of this clinic.';
    throw badRequest(message, { fields: [{ path: 'primaryTherapistId', message }] });
  }
}

export async function createClient(ctx: RequestContext, input: z.infer<typeof clientInputSchema>) {
  const clinic = scope(ctx).clinic(['admin', 'therapist'], input.clinicId);
  const clinicId = clinic.id;
  await checkPrimaryTherapist(clinic.db, clinicId, input.primaryTherapistId);
  const [row] = await clinic.db<ClientRow>('clients')
    .insert({
      display_name: input.name,
      time_zone: input.timezone,
      date_of_birth: input.dateOfBirth ?? null,
      diagnosis: input.diagnosis ?? 'other',
      injury_level: input.injuryLevel?.toUpperCase() ?? null,
      ais_grade: input.aisGrade ?? null,
      ad_risk: input.adRisk ?? 'unknown',
      body_mass_kg: input.bodyMassKg === undefined ? null : String(input.bodyMassKg),
      program_start: input.programStart ?? null,
      primary_therapist_id: input.primaryTherapistId ?? (ctx.viewer.memberships.some((m) => m.clinicId === clinicId && m.role === 'therapist') ? ctx.viewer.userId : null),
    })
    .returning('*');
  await clinic.audit({ action: 'client.create', clientId: row.id, recordType: 'client', recordId: row.id });
  return { id: row.id };
}
