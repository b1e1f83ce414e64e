import type { APIRoute } from 'astro';
import { signedIn } from '../../lib/auth/context';
import { handle, json } from '../../lib/http/respond';
import { caseload, caseloadQuerySchema } from '../../lib/supervision/caseload';

export const GET: APIRoute = ({ url, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await caseload(ctx, { onlyFlagged: true }, caseloadQuerySchema.parse(Object.fromEntries(url.searchParams))));
  });
