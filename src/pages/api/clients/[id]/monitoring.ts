import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { readJson } from '../../../../lib/http/request';
import { handle, json } from '../../../../lib/http/respond';
import { clientMonitoring, monitoringInputSchema, monthQuerySchema, recordMonitoring } from '../../../../lib/monitoring/monitoring';

export const GET: APIRoute = ({ params, url, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const { month } = monthQuerySchema.parse(Object.fromEntries(url.searchParams));
    return json(await clientMonitoring(ctx, params.id!, month));
  });

export const POST: APIRoute = ({ params, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await recordMonitoring(ctx, params.id!, await readJson(request, monitoringInputSchema)), 201);
  });
