import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { readJson } from '../../../lib/http/request';
import { handle, json } from '../../../lib/http/respond';
import { archiveProfile, updateProfile } from '../../../lib/profiles/profiles';
import { profileInputSchema } from '../../../lib/profiles/schema';

export const PUT: APIRoute = ({ params, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await updateProfile(ctx, params.id!, await readJson(request, profileInputSchema)));
  });

export const DELETE: APIRoute = ({ params, locals }) =>
  handle(async () => {
    await archiveProfile(signedIn(locals), params.id!);
    return json({ archived: true });
  });
