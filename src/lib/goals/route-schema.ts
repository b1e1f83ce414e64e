// A custom route a therapist or rider draws. The server assigns the id.
import { z } from 'zod';
import { routeLengthM } from './route';
import { line } from '../validation/fields';

const point = z
  .object({
    name: line(z.string().trim().max(80, { message: 'A point name may be at most 80 characters.' }), 'Point name').default(''),
    lat: z
      .number({ invalid_type_error: 'Latitude must be a number.' })
      .min(-90, { message: 'Latitude must be between -90 and 90.' })
      .max(90, { message: 'Latitude must be between -90 and 90.' }),
    lon: z
      .number({ invalid_type_error: 'Longitude must be a number.' })
      .min(-180, { message: 'Longitude must be between -180 and 180.' })
      .max(180, { message: 'Longitude must be between -180 and 180.' }),
    milestone: z.boolean().optional(),
  })
  .strict()
  .refine((p) => !p.milestone || p.name !== '', { message: 'A milestone needs a name.', path: ['name'] });

export const customRouteSchema = z
  .object({
    name: line(
      z
        .string({ required_error: 'The route needs a name.' })
        .trim()
        .min(1, { message: 'The route needs a name.' })
        .max(80, { message: 'A route name may be at most 80 characters.' }),
      'Route name',
    ),
    points: z
      .array(point)
      .min(2, { message: 'A route needs at least 2 points.' })
      .max(200, { message: 'A route may have at most 200 points.' }),
  })
  .strict()
  .refine((r) => r.points.length < 2 || routeLengthM({ id: '', ...r }) > 0, {
    message: 'The route has no length: its points are all in one place.',
    path: ['points'],
  });

export type CustomRouteInput = z.output<typeof customRouteSchema>;
