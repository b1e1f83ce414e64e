import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { readJson } from '../../../../lib/http/request';
import { handle, json } from '../../../../lib/http/respond';
import { prescriptionInputSchema } from '../../../../lib/supervision/prescription-rules';
import { readPrescription, savePrescription } from '../../../../lib/supervision/prescriptions';

export const GET: APIRoute = ({ params, locals }) =>
  handle(async () => {
    return json(await readPrescription(signedIn(locals), params.id!));
  });

export const PUT: APIRoute = ({ params, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await savePrescription(ctx, params.id!, await readJson(request, prescriptionInputSchema)), 201);
  });
