// Prescription limits. The ranges are those reported for FES cycling
// programmes in the review PRODUCT.md names (J NeuroEng Rehabil 2021, 92
// studies): 2–5 sessions a week, 10–60 minutes, cadence 35–50 rpm, pulse width
// 200–500 µs, current up to 180 mA, frequency 20–60 Hz. Warm-up, tolerance and
// resistance limits are Kinloop's own plausibility bounds.
import { z } from 'zod';
import type { PrescriptionRow } from '../db/tables';
import { NAMED_CHANNELS, NUMBERED_CHANNELS } from '../rides/types';
import { calendarDate, paragraph } from '../validation/fields';

const SOURCE = 'the range reported for FES cycling programmes (J NeuroEng Rehabil 2021 review)';
const within = (label: string, min: number, max: number, unit: string, source = SOURCE) =>
  z
    .number({ invalid_type_error: `${label}: enter a number.` })
    .min(min, `${label}: enter ${min}–${max} ${unit}, ${source}.`)
    .max(max, `${label}: enter ${min}–${max} ${unit}, ${source}.`);
const OWN = 'Kinloop’s plausibility limit';

export const PRESCRIPTION_LIMITS = {
  sessionsPerWeek: [2, 5],
  minutesPerSession: [10, 60],
  targetCadenceRpm: [35, 50],
  pulseWidthUs: [200, 500],
  maxCurrentMa: [0, 180],
  frequencyHz: [20, 60],
} as const;

const channelLimits = z
  .object({
    maxCurrentMa: within('Maximum current', 0, 180, 'mA').optional(),
    pulseWidthUs: within('Pulse width', 200, 500, 'µs').optional(),
    frequencyHz: within('Frequency', 20, 60, 'Hz').optional(),
  })
  .strict();

export const prescriptionInputSchema = z
  .object({
    sessionsPerWeek: within('Sessions per week', 2, 5, 'sessions').int('Sessions per week: enter a whole number.'),
    minutesPerSession: within('Minutes per session', 10, 60, 'minutes').int('Minutes per session: enter whole minutes.'),
    warmupMinutes: within('Warm-up', 0, 20, 'minutes', OWN).int().optional(),
    targetCadenceRpm: within('Target cadence', 35, 50, 'rpm').optional(),
    cadenceToleranceRpm: within('Cadence tolerance', 1, 15, 'rpm', OWN).optional(),
    resistance: within('Resistance level', 0, 10, '', OWN).optional(),
    channels: z.record(z.enum([...NAMED_CHANNELS, ...NUMBERED_CHANNELS]), channelLimits).optional(),
    notes: paragraph(z.string().trim().max(2000, 'Notes: at most 2000 characters.'), 'Notes').optional(),
    effectiveFrom: calendarDate('Effective date'),
  })
  .strict()
  .refine((p) => p.warmupMinutes === undefined || p.warmupMinutes < p.minutesPerSession, {
    message: 'Warm-up: the warm-up must be shorter than the whole session.',
    path: ['warmupMinutes'],
  });
export type PrescriptionInput = z.infer<typeof prescriptionInputSchema>;

type Stored = Pick<PrescriptionRow, 'sessions_per_week' | 'minutes_per_session' | 'warmup_minutes' | 'target_cadence_rpm' | 'cadence_tolerance_rpm' | 'resistance' | 'channels' | 'notes'>;

const channelKey = (channels: Record<string, Partial<Record<string, number>>> | undefined) =>
  JSON.stringify(
    Object.entries(channels ?? {})
      .map(([name, l]) => [name, ['maxCurrentMa', 'pulseWidthUs', 'frequencyHz'].map((f) => l[f] ?? null)])
      .sort(([a], [b]) => String(a).localeCompare(String(b))),
  );

/** True when a new version would hold exactly what `stored` holds: a version that changes nothing is refused. */
export function sameAsStored(input: PrescriptionInput, stored: Stored): boolean {
  const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));
  return (
    input.sessionsPerWeek === num(stored.sessions_per_week) &&
    input.minutesPerSession === num(stored.minutes_per_session) &&
    (input.warmupMinutes ?? null) === num(stored.warmup_minutes) &&
    (input.targetCadenceRpm ?? null) === num(stored.target_cadence_rpm) &&
    (input.cadenceToleranceRpm ?? null) === num(stored.cadence_tolerance_rpm) &&
    (input.resistance ?? null) === num(stored.resistance) &&
    channelKey(input.channels) === channelKey(stored.channels as Record<string, Partial<Record<string, number>>>) &&
    (input.notes ?? '') === (stored.notes ?? '')
  );
}
