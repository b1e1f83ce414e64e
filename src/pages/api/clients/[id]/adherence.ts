import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { handle, json } from '../../../../lib/http/respond';
import { adherenceQuerySchema, clientAdherence } from '../../../../lib/supervision/client-figures';

export const GET: APIRoute = ({ params, url, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const { weeks } = adherenceQuerySchema.parse(Object.fromEntries(url.searchParams));
    return json(await clientAdherence(ctx, params.id!, weeks));
  });
