import { z } from 'zod';
import { NAMED_CHANNELS, NUMBERED_CHANNELS } from '../rides/types';
import { line } from '../validation/fields';

const FIELDS = ['time', 'phase', 'cadence', 'power', 'distance', 'pulse_width', 'frequency', 'heart_rate', ...NAMED_CHANNELS, ...NUMBERED_CHANNELS] as const;

export const importMappingSchema = z.object({
  name: line(z.string().trim().min(1).max(80), 'Name'),
  columns: z
    .record(
      line(z.string().trim().min(1, 'A header name cannot be empty.').max(120), 'Header name'),
      z.object({ field: z.enum(FIELDS), unit: line(z.string().trim().max(20), 'Unit').optional() }),
    )
    .refine((c) => Object.keys(c).length <= 60, 'At most 60 mapped columns.'),
  metresPerRev: z.number().min(0.1, 'Metres per revolution is at least 0.1.').max(20, 'Metres per revolution is at most 20.').optional(),
  timeFormat: z.enum(['seconds', 'milliseconds', 'clock', 'iso']).optional(),
});

export const profileInputSchema = z.object({
  name: line(z.string().trim().min(1, 'Give the profile a name.').max(80), 'Name'),
  deviceName: line(z.string().trim().max(80), 'Device name').optional(),
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
  serial: line(z.string().trim().min(1, 'Enter the device serial as the ride files show it.').max(80), 'Serial'),
  name: line(z.string().trim().max(80), 'Name').optional(),
  importProfileId: z.string().uuid().nullable().optional(),
  clinicId: z.string().uuid().optional(),
});
