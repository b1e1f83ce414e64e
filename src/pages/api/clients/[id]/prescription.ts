import type { APIRoute } from 'astro';
import { DateTime } from 'luxon';
import { signedIn } from '../../../../lib/auth/context';
import { readJson } from '../../../../lib/http/request';
import { handle, json } from '../../../../lib/http/respond';
import { prescriptionInputSchema } from '../../../../lib/supervision/prescription-rules';
import { readPrescription, savePrescription } from '../../../../lib/supervision/prescriptions';

export const GET: APIRoute = ({ params, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const client = await ctx.knex('clients').where({ id: params.id }).first('time_zone').catch(() => null);
    const today = DateTime.now().setZone(client?.time_zone ?? 'UTC').toISODate()!;
    return json(await readPrescription(ctx, params.id!, today));
  });

export const PUT: APIRoute = ({ params, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await savePrescription(ctx, params.id!, await readJson(request, prescriptionInputSchema)), 201);
  });
