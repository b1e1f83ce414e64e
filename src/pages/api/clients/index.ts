import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { clientInputSchema, createClient } from '../../../lib/clients/create';
import { clientListQuerySchema, listVisibleClients } from '../../../lib/clients/read';
import { readJson } from '../../../lib/http/request';
import { handle, json } from '../../../lib/http/respond';

export const GET: APIRoute = ({ url, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await listVisibleClients(ctx, clientListQuerySchema.parse(Object.fromEntries(url.searchParams))));
  });

export const POST: APIRoute = ({ request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await createClient(ctx, await readJson(request, clientInputSchema)), 201);
  });
