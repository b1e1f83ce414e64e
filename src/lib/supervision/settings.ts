import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import { DEFAULT_FLAG_THRESHOLDS, flagThresholdsSchema, type FlagThresholds } from '../flags';
import { z } from 'zod';
import { defaultLocaleFor, isSupportedLocale } from '../time/locale';
import { scheduleFlagEvaluation } from './flag-jobs';

// Kinloop's plausibility limits for the thresholds that have no upper bound of
// their own: a value beyond them is a typing mistake, and an unbounded one
// (1e308 days) would break the date arithmetic of every later evaluation.
const PLAUSIBLE: [key: 'missedNoSessionDays' | 'baselineSessions' | 'baselineMinSessions' | 'currentRiseReviewPct', max: number, words: string][] = [
  ['missedNoSessionDays', 365, 'Days without a session: at most 365'],
  ['baselineSessions', 100, 'Baseline sessions: at most 100'],
  ['baselineMinSessions', 100, 'Fewest baseline sessions: at most 100'],
  ['currentRiseReviewPct', 1000, 'Current rise for review: at most 1000 %'],
];

/** The body of PUT /api/clinic/settings: the thresholds, each within a plausible range. */
export const clinicSettingsInputSchema = flagThresholdsSchema.superRefine((t, ctx) => {
  for (const [key, max, words] of PLAUSIBLE) {
    if (t[key] > max) ctx.addIssue({ code: 'custom', path: [key], message: `${words} (Kinloop’s plausibility limit).` });
  }
});

export async function readClinicSettings(ctx: RequestContext, clinicId?: string) {
  const clinic = await scope(ctx).clinic(['admin', 'therapist'], clinicId).clinic();
  return {
    clinicId: clinic.id,
    name: clinic.name,
    timeZone: clinic.time_zone,
    /** The clinic's own choice, or null for the default from its time zone. */
    locale: clinic.locale,
    defaultLocale: defaultLocaleFor(clinic.time_zone),
    flagThresholds: flagThresholdsSchema.parse(clinic.flag_thresholds),
    defaults: DEFAULT_FLAG_THRESHOLDS,
  };
}

export const clinicLocaleSchema = z
  .object({
    locale: z
      .string()
      .max(35)
      .refine(isSupportedLocale, { message: 'Date format: choose one of the listed languages and regions (a BCP 47 tag such as en-GB).' })
      .nullable(),
  })
  .strict();

/** The locale the clinic's dates and numbers are written in (admins); null goes back to the default from its time zone. */
export async function saveClinicLocale(ctx: RequestContext, locale: string | null, clinicId?: string) {
  const clinic = scope(ctx).clinic(['admin'], clinicId);
  await clinic.db('clinics').update({ locale });
  await clinic.audit({ action: 'clinic.settings_change', detail: { locale } });
  return readClinicSettings(ctx, clinic.id);
}

/** Changes the clinic's flag thresholds (admins); every client is judged again with them. */
export async function saveClinicSettings(ctx: RequestContext, thresholds: FlagThresholds, clinicId?: string) {
  const clinic = scope(ctx).clinic(['admin'], clinicId);
  await clinic.db('clinics').update({ flag_thresholds: JSON.stringify(thresholds) });
  await clinic.audit({ action: 'clinic.settings_change', detail: { flagThresholds: thresholds } });
  for (const c of await clinic.db('clients').select('id')) await scheduleFlagEvaluation(c.id, 0);
  return readClinicSettings(ctx, clinic.id);
}
