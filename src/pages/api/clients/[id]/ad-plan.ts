import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { adPlanInputSchema, readAdPlan, saveAdPlan } from '../../../../lib/care/ad-plan';
import { readJson } from '../../../../lib/http/request';
import { handle, json } from '../../../../lib/http/respond';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await readAdPlan(signedIn(locals), params.id!)));

export const PUT: APIRoute = ({ params, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await saveAdPlan(ctx, params.id!, await readJson(request, adPlanInputSchema)), 201);
  });
