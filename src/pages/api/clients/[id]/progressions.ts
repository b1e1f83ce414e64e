import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { clientProgressions } from '../../../../lib/care/progression-service';
import { handle, json } from '../../../../lib/http/respond';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await clientProgressions(signedIn(locals), params.id!)));
