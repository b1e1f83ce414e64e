import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { readScreening, saveScreening, screeningInputSchema } from '../../../../lib/care/screening';
import { readJson } from '../../../../lib/http/request';
import { handle, json } from '../../../../lib/http/respond';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await readScreening(signedIn(locals), params.id!)));

export const PUT: APIRoute = ({ params, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await saveScreening(ctx, params.id!, await readJson(request, screeningInputSchema)));
  });
