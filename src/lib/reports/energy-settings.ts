// The clinic's efficiency for energy estimates: a setting of its own, apart
// from the flag thresholds, since it changes what reports and exports say and
// nothing about flags.
import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import { DEFAULT_FES_EFFICIENCY_PCT, FES_EFFICIENCY_RANGE_PCT } from './energy';

const { min, max } = FES_EFFICIENCY_RANGE_PCT;
export const energySettingsSchema = z
  .object({
    efficiencyPct: z
      .number({ invalid_type_error: 'Efficiency: enter a number of per cent.' })
      .min(min, `Efficiency: enter ${min}–${max} %, the range studies of FES cycling report.`)
      .max(max, `Efficiency: enter ${min}–${max} %, the range studies of FES cycling report.`)
      .multipleOf(0.1, 'Efficiency: at most one decimal.')
      .nullable(),
  })
  .strict();

/** The stored setting (a decimal column comes back as a string), or Kinloop's default. */
export function clinicEfficiencyPct(stored: string | number | null | undefined): number {
  return stored === null || stored === undefined ? DEFAULT_FES_EFFICIENCY_PCT : Number(stored);
}

export async function readEnergySettings(ctx: RequestContext, clinicId?: string) {
  const grant = scope(ctx).clinic(['admin', 'therapist'], clinicId);
  const clinic = await grant.clinic();
  return {
    clinicId: grant.id,
    efficiencyPct: clinicEfficiencyPct(clinic.fes_efficiency_pct),
    isDefault: clinic.fes_efficiency_pct === null,
    defaultPct: DEFAULT_FES_EFFICIENCY_PCT,
    range: FES_EFFICIENCY_RANGE_PCT,
  };
}

/** Admins set the efficiency; null goes back to Kinloop's default. */
export async function saveEnergySettings(ctx: RequestContext, input: z.infer<typeof energySettingsSchema>, clinicId?: string) {
  const clinic = scope(ctx).clinic(['admin'], clinicId);
  await clinic.db('clinics').update({ fes_efficiency_pct: input.efficiencyPct });
  await clinic.audit({ action: 'clinic.energy_settings_change', detail: { efficiencyPct: input.efficiencyPct } });
  return readEnergySettings(ctx, clinic.id);
}
