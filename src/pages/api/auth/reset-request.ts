import type { APIRoute } from 'astro';
import { requestPasswordReset, resetRequestSchema } from '../../../lib/auth/password-reset';
import { authDb } from '../../../lib/data';
import { readJson } from '../../../lib/http/request';
import { handle, json } from '../../../lib/http/respond';

// Always 202 with the same words, so the answer never tells whether an e-mail has an account.
export const POST: APIRoute = ({ request, locals }) =>
  handle(async () => {
    const { email } = await readJson(request, resetRequestSchema);
    await requestPasswordReset(authDb(), email, locals);
    return json({ message: 'If that e-mail belongs to an active account, a reset link is on its way. It works for 60 minutes.' }, 202);
  });
