import type { APIRoute } from 'astro';
import { signedIn } from '../../../../lib/auth/context';
import { readClient } from '../../../../lib/clients/read';
import { clientUpdateSchema, updateClient } from '../../../../lib/clients/update';
import { readJson } from '../../../../lib/http/request';
import { handle, json } from '../../../../lib/http/respond';

export const GET: APIRoute = ({ params, locals }) => handle(async () => json(await readClient(signedIn(locals), params.id!)));

export const PATCH: APIRoute = ({ params, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await updateClient(ctx, params.id!, await readJson(request, clientUpdateSchema)));
  });
