import { IANAZone } from 'luxon';
import { z } from 'zod';
import { staffClinic } from '../auth/access';
import { auditAs, type RequestContext } from '../auth/context';
import type { ClientRow } from '../db/tables';

export const clientInputSchema = z
  .object({
    name: z.string().trim().min(1, 'Name: enter the client’s name.').max(120),
    timezone: z.string().refine((tz) => IANAZone.isValidZone(tz), 'Time zone: choose a time zone such as Europe/London.'),
    dateOfBirth: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Date of birth: use the form YYYY-MM-DD.').optional(),
    diagnosis: z.enum(['sci', 'ms', 'stroke', 'cerebral_palsy', 'other']).optional(),
    injuryLevel: z.string().trim().regex(/^[CTLS]\d{1,2}$/i, 'Level: write it like C6, T4 or L1.').optional(),
    aisGrade: z.enum(['A', 'B', 'C', 'D', 'E']).optional(),
    adRisk: z.enum(['at_risk', 'not_at_risk', 'unknown']).optional(),
    bodyMassKg: z.number().min(20, 'Body mass: enter 20–300 kg.').max(300, 'Body mass: enter 20–300 kg.').optional(),
    programStart: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Program start: use the form YYYY-MM-DD.').optional(),
    primaryTherapistId: z.string().uuid().optional(),
    clinicId: z.string().uuid().optional(),
  })
  .strict();

export async function createClient(ctx: RequestContext, input: z.infer<typeof clientInputSchema>) {
  const clinicId = staffClinic(ctx.viewer, ['admin', 'therapist'], input.clinicId);
  const [row] = await ctx.knex<ClientRow>('clients')
    .insert({
      clinic_id: clinicId,
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
  await auditAs(ctx, { action: 'client.create', clinicId, clientId: row.id, recordType: 'client', recordId: row.id });
  return { id: row.id };
}
