import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { readClient } from '../../../../lib/clients/read';
import { handle, json } from '../../../../lib/http/respond';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await readClient(signedIn(locals), params.id!)));
