import type { APIRoute } from 'astro';
import { staffClinic } from '../../../lib/auth/access';
import { signedIn } from '../../../lib/auth/context';
import { readJson } from '../../../lib/http/request';
import { handle, json } from '../../../lib/http/respond';
import { previewProfile } from '../../../lib/profiles/profiles';
import { previewInputSchema } from '../../../lib/profiles/schema';

export const POST: APIRoute = ({ request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    staffClinic(ctx.viewer, ['admin']);
    return json(previewProfile(await readJson(request, previewInputSchema)));
  });
