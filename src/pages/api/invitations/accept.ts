import type { APIRoute } from 'astro';
import { acceptInputSchema, acceptInvitation } from '../../../lib/auth/invitations';
import { signedInResponse } from '../../../lib/auth/signed-in-response';
import { db } from '../../../lib/db/knex';
import { readJson } from '../../../lib/http/request';
import { handle } from '../../../lib/http/respond';

export const POST: APIRoute = ({ request, locals, cookies }) =>
  handle(async () => {
    const input = await readJson(request, acceptInputSchema);
    const result = await acceptInvitation(db(), input, locals);
    return signedInResponse(db(), cookies, result, locals.device);
  });
