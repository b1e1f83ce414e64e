import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { handle, json } from '../../../../lib/http/respond';
import { listSessions, sessionsQuerySchema } from '../../../../lib/sessions/read';

export const GET: APIRoute = ({ params, url, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await listSessions(ctx, params.id!, sessionsQuerySchema.parse(Object.fromEntries(url.searchParams))));
  });
