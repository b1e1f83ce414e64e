import type { APIRoute } from 'astro';
import { signIn, signInInputSchema } from '../../../lib/auth/sign-in';
import { signedInResponse } from '../../../lib/auth/signed-in-response';
import { db } from '../../../lib/db/knex';
import { readJson } from '../../../lib/http/request';
import { handle } from '../../../lib/http/respond';

export const POST: APIRoute = ({ request, locals, cookies }) =>
  handle(async () => {
    const input = await readJson(request, signInInputSchema);
    const result = await signIn(db(), input, locals);
    return signedInResponse(db(), cookies, result, locals.device);
  });
