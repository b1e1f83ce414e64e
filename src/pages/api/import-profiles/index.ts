import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { readJson } from '../../../lib/http/request';
import { handle, json } from '../../../lib/http/respond';
import { createProfile, listProfiles } from '../../../lib/profiles/profiles';
import { profileInputSchema } from '../../../lib/profiles/schema';

export const GET: APIRoute = ({ locals }) => handle(async () => json({ profiles: await listProfiles(signedIn(locals)) }));

export const POST: APIRoute = ({ request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await createProfile(ctx, await readJson(request, profileInputSchema)), 201);
  });
