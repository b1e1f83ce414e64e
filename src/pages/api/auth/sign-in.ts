import type { APIRoute } from 'astro';
import { signIn, signInInputSchema } from '../../../lib/auth/sign-in';
import { signedInResponse } from '../../../lib/auth/signed-in-response';
import { authDb } from '../../../lib/data';
import { readJson } from '../../../lib/http/request';
import { handle } from '../../../lib/http/respond';

export const POST: APIRoute = ({ request, locals, cookies }) =>
  handle(async () => {
    const input = await readJson(request, signInInputSchema);
    const result = await signIn(authDb(), input, locals);
    return signedInResponse(authDb(), cookies, result, locals.device);
  });
