import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { badRequest } from '../../../lib/http/errors';
import { handle, json } from '../../../lib/http/respond';
import { listUploads, uploadRideFiles } from '../../../lib/ingest/uploads';

const DEFAULT_WAIT_MS = 8000;

export const POST: APIRoute = ({ request, url, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const wait = url.searchParams.get('wait') === '0' ? 0 : DEFAULT_WAIT_MS;
    const result = await uploadRideFiles(ctx, request, wait);
    return json(result, result.files.some((f) => f.status === 'queued') ? 202 : 200);
  });

export const GET: APIRoute = ({ url, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const clientId = url.searchParams.get('clientId');
    if (!clientId) throw badRequest('Say whose uploads to list: ?clientId=…');
    return json({ uploads: await listUploads(ctx, clientId) });
  });
