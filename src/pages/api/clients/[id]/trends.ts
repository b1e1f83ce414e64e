import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { handle, json } from '../../../../lib/http/respond';
import { clientTrends } from '../../../../lib/supervision/client-figures';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await clientTrends(signedIn(locals), params.id!)));
