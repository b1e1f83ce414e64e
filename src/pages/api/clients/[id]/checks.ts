import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { checkInputSchema } from '../../../../lib/checks/check-input';
import { readJson } from '../../../../lib/http/request';
import { handle, json } from '../../../../lib/http/respond';
import { listChecks, recordCheck } from '../../../../lib/riders/checks';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await listChecks(signedIn(locals), params.id!)));

export const POST: APIRoute = ({ params, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await recordCheck(ctx, params.id!, await readJson(request, checkInputSchema)), 201);
  });
