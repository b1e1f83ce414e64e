import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { handle, json } from '../../../../lib/http/respond';
import { clientFlags } from '../../../../lib/supervision/flags';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await clientFlags(signedIn(locals), params.id!)));
