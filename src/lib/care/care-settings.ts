// The clinic's settings for care before and between rides: how long a medical
// clearance holds before its review, and the absolute systolic level that
// counts as an episode for a client at risk of autonomic dysreflexia whatever
// the baseline. Kept apart from the flag thresholds, which judge rides.
import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope, type Db } from '../data';
import { DEFAULT_AD_ABSOLUTE_SYSTOLIC_MMHG } from '../checks/evaluate-check';

export const DEFAULT_CLEARANCE_REVIEW_MONTHS = 12;
/** A clearance whose review is this near is "due for review". */
export const CLEARANCE_DUE_DAYS = 30;

// Kinloop's plausibility bounds: a review beyond five years or a level outside
// what a sphygmomanometer reads in an adult is a typing mistake.
export const careSettingsSchema = z
  .object({
    clearanceReviewMonths: z
      .number({ invalid_type_error: 'Clearance review: enter a whole number of months.' })
      .int('Clearance review: enter a whole number of months.')
      .min(1, 'Clearance review: enter 1–60 months (Kinloop’s plausibility limit).')
      .max(60, 'Clearance review: enter 1–60 months (Kinloop’s plausibility limit).')
      .nullable(),
    adAbsoluteSystolic: z
      .number({ invalid_type_error: 'Absolute systolic level: enter a whole number of mmHg.' })
      .int('Absolute systolic level: enter a whole number of mmHg.')
      .min(120, 'Absolute systolic level: enter 120–200 mmHg (Kinloop’s plausibility limit).')
      .max(200, 'Absolute systolic level: enter 120–200 mmHg (Kinloop’s plausibility limit).')
      .nullable(),
  })
  .strict();

export interface CareSettings {
  clearanceReviewMonths: number;
  adAbsoluteSystolic: number;
}

export function careSettingsOf(row: { clearance_review_months: number | null; ad_absolute_systolic: number | null } | undefined): CareSettings {
  return {
    clearanceReviewMonths: row?.clearance_review_months ?? DEFAULT_CLEARANCE_REVIEW_MONTHS,
    adAbsoluteSystolic: row?.ad_absolute_systolic ?? DEFAULT_AD_ABSOLUTE_SYSTOLIC_MMHG,
  };
}

export async function clinicCareSettings(knex: Db, clinicId: string): Promise<CareSettings> {
  return careSettingsOf(await knex('clinics').where({ id: clinicId }).first('clearance_review_months', 'ad_absolute_systolic'));
}

export async function readCareSettings(ctx: RequestContext, clinicId?: string) {
  const grant = scope(ctx).clinic(['admin', 'therapist'], clinicId);
  const row = await grant.clinic();
  return {
    clinicId: grant.id,
    ...careSettingsOf(row),
    isDefault: { clearanceReviewMonths: row.clearance_review_months === null, adAbsoluteSystolic: row.ad_absolute_systolic === null },
    defaults: { clearanceReviewMonths: DEFAULT_CLEARANCE_REVIEW_MONTHS, adAbsoluteSystolic: DEFAULT_AD_ABSOLUTE_SYSTOLIC_MMHG },
  };
}

/** Admins change them; null goes back to Kinloop's default. */
export async function saveCareSettings(ctx: RequestContext, input: z.infer<typeof careSettingsSchema>, clinicId?: string) {
  const clinic = scope(ctx).clinic(['admin'], clinicId);
  await clinic.transaction(async (tx) => {
    await tx.db('clinics').update({ clearance_review_months: input.clearanceReviewMonths, ad_absolute_systolic: input.adAbsoluteSystolic });
    await tx.audit({ action: 'clinic.care_settings_change', detail: input });
  });
  return readCareSettings(ctx, clinic.id);
}

