import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { readJson } from '../../../lib/http/request';
import { handle, json } from '../../../lib/http/respond';
import { preferencesInputSchema, readPreferences, savePreferences } from '../../../lib/notifications/preferences';

export const GET: APIRoute = ({ locals }) => handle(async () => json(await readPreferences(signedIn(locals))));

export const PUT: APIRoute = ({ request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    return json(await savePreferences(ctx, await readJson(request, preferencesInputSchema)));
  });
