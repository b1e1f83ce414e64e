import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { forbidden } from '../../../lib/http/errors';
import { readJson } from '../../../lib/http/request';
import { handle, json } from '../../../lib/http/respond';
import { listDevices, saveDevice } from '../../../lib/profiles/profiles';
import { deviceInputSchema } from '../../../lib/profiles/schema';

export const GET: APIRoute = ({ locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    if (!ctx.viewer.memberships.length) throw forbidden();
    return json({ devices: await listDevices(ctx) });
  });

export const POST: APIRoute = ({ request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await saveDevice(ctx, await readJson(request, deviceInputSchema)), 201);
  });
