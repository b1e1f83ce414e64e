import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { readJson } from '../../../lib/http/request';
import { handle, json } from '../../../lib/http/respond';
import { energySettingsSchema, readEnergySettings, saveEnergySettings } from '../../../lib/reports/energy-settings';

export const GET: APIRoute = ({ url, locals }) => handle(async () => json(await readEnergySettings(signedIn(locals), url.searchParams.get('clinicId') ?? undefined)));

export const PUT: APIRoute = ({ url, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const input = await readJson(request, energySettingsSchema);
    return json(await saveEnergySettings(ctx, input, url.searchParams.get('clinicId') ?? undefined));
  });
