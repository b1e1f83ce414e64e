// The limits the server enforces, read from its own schema so that the form's
// help text can never disagree with the validation messages. Used in the
// page's frontmatter; the island receives the plain numbers.
import type { ZodNumber, ZodObject, ZodOptional, ZodRawShape, ZodRecord, ZodTypeAny } from 'zod';
import { prescriptionInputSchema } from '../../lib/supervision/prescription-rules';

export const LIMITED_FIELDS = ['sessionsPerWeek', 'minutesPerSession', 'warmupMinutes', 'targetCadenceRpm', 'cadenceToleranceRpm', 'resistance'] as const;
export const CHANNEL_FIELDS = ['maxCurrentMa', 'pulseWidthUs', 'frequencyHz'] as const;
export type LimitedField = (typeof LIMITED_FIELDS)[number] | (typeof CHANNEL_FIELDS)[number];
export type PrescriptionLimits = Record<LimitedField, { min: number; max: number }>;

function bounds(schema: ZodTypeAny): { min: number; max: number } {
  const number = (schema.isOptional() ? (schema as ZodOptional<ZodNumber>).unwrap() : schema) as ZodNumber;
  if (number.minValue === null || number.maxValue === null) throw new Error('A prescription number without both limits');
  return { min: number.minValue, max: number.maxValue };
}

export function prescriptionLimits(): PrescriptionLimits {
  const shape = prescriptionInputSchema.innerType().shape;
  const channels = (shape.channels as ZodOptional<ZodRecord<ZodTypeAny, ZodObject<ZodRawShape>>>).unwrap().valueSchema.shape;
  const limits = {} as PrescriptionLimits;
  for (const f of LIMITED_FIELDS) limits[f] = bounds(shape[f]);
  for (const f of CHANNEL_FIELDS) limits[f] = bounds(channels[f]);
  return limits;
}
