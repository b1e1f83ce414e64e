import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { handle, json } from '../../../../lib/http/respond';
import { clientTrends, trendsQuerySchema } from '../../../../lib/supervision/client-figures';

export const GET: APIRoute = ({ params, url, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const { weeks } = trendsQuerySchema.parse(Object.fromEntries(url.searchParams));
    return json(await clientTrends(ctx, params.id!, weeks));
  });
