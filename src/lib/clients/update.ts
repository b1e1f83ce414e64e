import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import { checkPrimaryTherapist, clientInputSchema } from './create';
import { readClient } from './read';

export const clientUpdateSchema = z
  .object({
    name: clientInputSchema.shape.name.optional(),
    timezone: clientInputSchema.shape.timezone.optional(),
    injuryLevel: clientInputSchema.shape.injuryLevel.nullable(),
    aisGrade: clientInputSchema.shape.aisGrade.nullable(),
    adRisk: clientInputSchema.shape.adRisk,
    bodyMassKg: clientInputSchema.shape.bodyMassKg.nullable(),
    programStart: clientInputSchema.shape.programStart.nullable(),
    primaryTherapistId: z.string().uuid().nullable().optional(),
    /** Whether the rider also pedals by their own effort (the volitional-cycling equation is shown beside energy estimates then); null: not recorded. */
    volitionalControl: z.boolean().nullable().optional(),
    /** The resting systolic pressure that rises are judged against (the therapist's value; without it the median of pre-ride readings). */
    baselineSystolic: z.number().int().min(70, 'Baseline systolic: enter 70–200 mmHg.').max(200, 'Baseline systolic: enter 70–200 mmHg.').nullable().optional(),
  })
  .strict();

const COLUMNS: Record<string, string> = {
  name: 'display_name',
  timezone: 'time_zone',
  injuryLevel: 'injury_level',
  aisGrade: 'ais_grade',
  adRisk: 'ad_risk',
  bodyMassKg: 'body_mass_kg',
  programStart: 'program_start',
  primaryTherapistId: 'primary_therapist_id',
  baselineSystolic: 'baseline_systolic',
  volitionalControl: 'volitional_control',
};

export async function updateClient(ctx: RequestContext, clientId: string, input: z.infer<typeof clientUpdateSchema>) {
  const client = await scope(ctx).client(clientId, 'manage', 'client.update', { fields: Object.keys(input) });
  await checkPrimaryTherapist(client.db, client.clinicId, input.primaryTherapistId);
  const changes = Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined).map(([k, v]) => [COLUMNS[k], k === 'injuryLevel' && typeof v === 'string' ? v.toUpperCase() : v]));
  if (Object.keys(changes).length) await client.db('clients').update({ ...changes, updated_at: client.db.fn.now() });
  await client.audit({ action: 'client.changed', detail: { fields: Object.keys(input) } });
  return readClient(ctx, client.id);
}
