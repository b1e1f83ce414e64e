import type { APIRoute } from 'astro';
import { z } from 'zod';
import { signIn } from '../../../lib/auth/sign-in';
import { signedInResponse } from '../../../lib/auth/signed-in-response';
import { db } from '../../../lib/db/knex';
import { readJson } from '../../../lib/http/request';
import { handle } from '../../../lib/http/respond';

const schema = z.object({
  email: z.string().trim().min(1, 'Enter your e-mail address.').max(254),
  password: z.string().min(1, 'Enter your password.').max(200),
});

export const POST: APIRoute = ({ request, locals, cookies }) =>
  handle(async () => {
    const input = await readJson(request, schema);
    const result = await signIn(db(), input, locals);
    return signedInResponse(db(), cookies, result);
  });
