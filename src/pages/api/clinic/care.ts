import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { careSettingsSchema, readCareSettings, saveCareSettings } from '../../../lib/care/care-settings';
import { readJson } from '../../../lib/http/request';
import { handle, json } from '../../../lib/http/respond';

export const GET: APIRoute = ({ url, locals }) => handle(async () => json(await readCareSettings(signedIn(locals), url.searchParams.get('clinicId') ?? undefined)));

export const PUT: APIRoute = ({ url, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const input = await readJson(request, careSettingsSchema);
    return json(await saveCareSettings(ctx, input, url.searchParams.get('clinicId') ?? undefined));
  });
