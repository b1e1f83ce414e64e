import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { listVisibleClients } from '../../../lib/clients/read';
import { handle, json } from '../../../lib/http/respond';

export const GET: APIRoute = ({ locals }) => handle(async () => json({ clients: await listVisibleClients(signedIn(locals)) }));
