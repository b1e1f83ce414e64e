import type { APIRoute } from 'astro';
import { acceptInputSchema, acceptInvitation } from '../../../lib/auth/invitations';
import { signedInResponse } from '../../../lib/auth/signed-in-response';
import { authDb } from '../../../lib/data';
import { readJson } from '../../../lib/http/request';
import { handle } from '../../../lib/http/respond';

export const POST: APIRoute = ({ request, locals, cookies }) =>
  handle(async () => {
    const input = await readJson(request, acceptInputSchema);
    const result = await acceptInvitation(authDb(), input, locals);
    return signedInResponse(authDb(), cookies, result, locals.device);
  });
