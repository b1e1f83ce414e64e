import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { readJson } from '../../../lib/http/request';
import { handle, json } from '../../../lib/http/respond';
import { actOnFlag, flagActionSchema } from '../../../lib/supervision/flags';

export const POST: APIRoute = ({ params, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await actOnFlag(ctx, params.id!, await readJson(request, flagActionSchema)));
  });
