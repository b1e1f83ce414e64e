// The body a carer or client sends to record a check, and the stored record.
// Limits are plausibility limits for typing mistakes, not clinical ranges.
import { z } from 'zod';
import { instant, paragraph } from '../validation/fields';

export const AD_SYMPTOMS = [
  'pounding_headache',
  'flushing_or_sweating_above_injury',
  'goose_bumps',
  'blurred_vision',
  'nasal_congestion',
  'slow_pulse',
] as const;
export type AdSymptom = (typeof AD_SYMPTOMS)[number];

export const OTHER_EVENTS = ['spasms', 'pain', 'light_headedness', 'fall_or_transfer_problem'] as const;
export type OtherEvent = (typeof OTHER_EVENTS)[number];

export const SKIN_STATES = ['normal', 'redness_fades_30min', 'redness_persists', 'broken_skin'] as const;
export type SkinState = (typeof SKIN_STATES)[number];

export const SYSTOLIC_RANGE = { min: 50, max: 300 } as const;
export const DIASTOLIC_RANGE = { min: 20, max: 200 } as const;
export const HEART_RATE_RANGE = { min: 20, max: 250 } as const;
export const BP_AFTER_MINUTES_MAX = 240;
export const COMMENT_MAX = 2000;

function wholeNumberIn(label: string, unit: string, min: number, max: number) {
  const message = `${label} must be between ${min} and ${max}${unit ? ` ${unit}` : ''}.`;
  return z
    .number({ required_error: `${label} is missing.`, invalid_type_error: `${label} must be a number.` })
    .int({ message: `${label} must be a whole number.` })
    .min(min, { message })
    .max(max, { message });
}

function bloodPressure(when: string) {
  return z
    .object(
      {
        systolic: wholeNumberIn(`Systolic pressure ${when}`, 'mmHg', SYSTOLIC_RANGE.min, SYSTOLIC_RANGE.max),
        diastolic: wholeNumberIn(`Diastolic pressure ${when}`, 'mmHg', DIASTOLIC_RANGE.min, DIASTOLIC_RANGE.max),
      },
      { invalid_type_error: `Blood pressure ${when} must give systolic and diastolic.` },
    )
    .strict()
    .refine((bp) => bp.systolic > bp.diastolic, {
      message: `Systolic pressure ${when} must be higher than diastolic; check whether the two were swapped.`,
      path: ['diastolic'],
    });
}

function uniqueList<T extends string>(values: readonly [T, ...T[]], label: string) {
  return z
    .array(z.enum(values, { errorMap: () => ({ message: `Unknown ${label}; expected one of: ${values.join(', ')}.` }) }))
    .default([])
    .refine((list) => new Set(list).size === list.length, { message: `Each ${label} may be listed once.` });
}

const skinEntry = z
  .object({
    site: z
      .string({ required_error: 'Each skin entry needs a site.' })
      .regex(/^[a-z][a-z0-9_]{0,39}$/, {
        message: 'A skin site is a short lower-case name such as quadriceps_left.',
      }),
    state: z.enum(SKIN_STATES, {
      errorMap: () => ({ message: `Skin state must be one of: ${SKIN_STATES.join(', ')}.` }),
    }),
  })
  .strict();

const bodyShape = z
  .object({
    takenAt: instant('takenAt', 'takenAt must be an ISO 8601 date-time with a time zone, e.g. 2026-10-05T09:30:00Z.').optional(),
    kind: z.literal('pre_post').default('pre_post'),
    bpBefore: bloodPressure('before the ride').optional(),
    bpDuring: bloodPressure('during the ride').optional(),
    bpAfter: bloodPressure('after the ride').optional(),
    bpAfterMinutes: wholeNumberIn('Minutes after the ride', 'minutes', 0, BP_AFTER_MINUTES_MAX).optional(),
    heartRateBefore: wholeNumberIn('Heart rate before the ride', 'beats per minute', HEART_RATE_RANGE.min, HEART_RATE_RANGE.max).optional(),
    heartRateAfter: wholeNumberIn('Heart rate after the ride', 'beats per minute', HEART_RATE_RANGE.min, HEART_RATE_RANGE.max).optional(),
    adSymptoms: uniqueList(AD_SYMPTOMS, 'symptom'),
    otherEvents: uniqueList(OTHER_EVENTS, 'event'),
    skin: z
      .array(skinEntry)
      .max(20, { message: 'At most 20 skin entries per check.' })
      .default([])
      .refine((list) => new Set(list.map((s) => s.site)).size === list.length, {
        message: 'Each skin site may be listed once.',
      }),
    effort: wholeNumberIn('Effort', '', 1, 10).optional(),
    comment: paragraph(z.string().trim().max(COMMENT_MAX, { message: `The comment may be at most ${COMMENT_MAX} characters.` }), 'Comment')
      .transform((s) => (s === '' ? undefined : s))
      .optional(),
    sessionId: z.string().uuid({ message: 'sessionId must be a session id (a UUID).' }).optional(),
  })
  // Unknown keys are refused rather than dropped: a misspelt field would
  // otherwise lose a reading silently. This also keeps clientId out of the body.
  .strict();

export const checkInputSchema = bodyShape
  .refine((c) => c.bpAfterMinutes === undefined || c.bpAfter !== undefined, {
    message: 'Minutes after the ride only make sense with a blood pressure after the ride.',
    path: ['bpAfterMinutes'],
  })
  .refine(
    (c) =>
      c.bpBefore !== undefined ||
      c.bpDuring !== undefined ||
      c.bpAfter !== undefined ||
      c.heartRateBefore !== undefined ||
      c.heartRateAfter !== undefined ||
      c.effort !== undefined ||
      c.adSymptoms.length > 0 ||
      c.otherEvents.length > 0 ||
      c.skin.length > 0 ||
      c.comment !== undefined,
    { message: 'A check needs at least one measurement, symptom, skin entry or comment.' },
  );

/** The body after validation (defaults applied). */
export type CheckInput = z.output<typeof checkInputSchema>;
/** What a client or carer may send. */
export type CheckInputBody = z.input<typeof checkInputSchema>;

export interface BloodPressure {
  systolic: number;
  diastolic: number;
}

export interface SkinEntry {
  site: string;
  state: SkinState;
}

/** A stored check: the validated body plus what the server sets. */
export interface CheckRecord extends Omit<CheckInput, 'takenAt' | 'kind'> {
  clientId: string;
  takenAt: string;
  kind: 'pre_post';
}
