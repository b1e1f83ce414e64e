import { z } from 'zod';
import { NAMED_CHANNELS, NUMBERED_CHANNELS } from '../rides/types';

const FIELDS = ['time', 'phase', 'cadence', 'power', 'distance', 'pulse_width', 'frequency', 'heart_rate', ...NAMED_CHANNELS, ...NUMBERED_CHANNELS] as const;

export const importMappingSchema = z.object({
  name: z.string().trim().min(1).max(80),
  columns: z
    .record(
      z.string().trim().min(1, 'A header name cannot be empty.').max(120),
      z.object({ field: z.enum(FIELDS), unit: z.string().trim().max(20).optional() }),
    )
    .refine((c) => Object.keys(c).length <= 60, 'At most 60 mapped columns.'),
  metresPerRev: z.number().min(0.1, 'Metres per revolution is at least 0.1.').max(20, 'Metres per revolution is at most 20.').optional(),
  timeFormat: z.enum(['seconds', 'milliseconds', 'clock', 'iso']).optional(),
});

export const profileInputSchema = z.object({
  name: z.string().trim().min(1, 'Give the profile a name.').max(80),
  deviceName: z.string().trim().max(80).optional(),
  clinicId: z.string().uuid().optional(),
  columns: importMappingSchema.shape.columns,
  metresPerRev: importMappingSchema.shape.metresPerRev,
  timeFormat: importMappingSchema.shape.timeFormat,
});
export type ProfileInput = z.infer<typeof profileInputSchema>;

export const previewInputSchema = z.object({
  /** The first bytes of a sample ride file, base64; the page sends at most 64 KB. */
  sampleBase64: z.string().min(1).max(90_000),
  profile: profileInputSchema.partial({ name: true }).optional(),
});

export const deviceInputSchema = z.object({
  serial: z.string().trim().min(1, 'Enter the device serial as the ride files show it.').max(80),
  name: z.string().trim().max(80).optional(),
  importProfileId: z.string().uuid().nullable().optional(),
  clinicId: z.string().uuid().optional(),
});
