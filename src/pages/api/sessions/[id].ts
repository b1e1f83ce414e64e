import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { handle, json } from '../../../lib/http/respond';
import { readSession, sessionQuerySchema } from '../../../lib/sessions/read';

export const GET: APIRoute = ({ params, url, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const { points } = sessionQuerySchema.parse(Object.fromEntries(url.searchParams));
    return json(await readSession(ctx, params.id!, points ?? null));
  });
