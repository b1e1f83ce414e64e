import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { clientInputSchema, createClient } from '../../../lib/clients/create';
import { listVisibleClients } from '../../../lib/clients/read';
import { readJson } from '../../../lib/http/request';
import { handle, json } from '../../../lib/http/respond';

export const GET: APIRoute = ({ locals }) => handle(async () => json({ clients: await listVisibleClients(signedIn(locals)) }));

export const POST: APIRoute = ({ request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await createClient(ctx, await readJson(request, clientInputSchema)), 201);
  });
