import type { APIRoute } from 'astro';
import { signedIn } from '../../../../../lib/auth/context';
import { readJson } from '../../../../../lib/http/request';
import { handle, json } from '../../../../../lib/http/respond';
import { createPause, listPauses, pauseInputSchema } from '../../../../../lib/supervision/pauses';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await listPauses(signedIn(locals), params.id!)));

export const POST: APIRoute = ({ params, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await createPause(ctx, params.id!, await readJson(request, pauseInputSchema)), 201);
  });
