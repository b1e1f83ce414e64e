import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { decideProgression, decisionSchema } from '../../../lib/care/progression-service';
import { readJson } from '../../../lib/http/request';
import { handle, json } from '../../../lib/http/respond';

export const POST: APIRoute = ({ params, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await decideProgression(ctx, params.id!, await readJson(request, decisionSchema)));
  });
