import type { APIRoute } from 'astro';
import { completePasswordReset, resetCompleteSchema } from '../../../lib/auth/password-reset';
import { signedInResponse } from '../../../lib/auth/signed-in-response';
import { authDb } from '../../../lib/data';
import { readJson } from '../../../lib/http/request';
import { handle } from '../../../lib/http/respond';

export const POST: APIRoute = ({ request, locals, cookies }) =>
  handle(async () => {
    const input = await readJson(request, resetCompleteSchema);
    const result = await completePasswordReset(authDb(), input, locals);
    return signedInResponse(authDb(), cookies, result, locals.device);
  });
