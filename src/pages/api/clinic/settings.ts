import type { APIRoute } from 'astro';
import { signedIn } from '../../../lib/auth/context';
import { readJson } from '../../../lib/http/request';
import { handle, json } from '../../../lib/http/respond';
import { clinicLocaleSchema, clinicSettingsInputSchema, readClinicSettings, saveClinicLocale, saveClinicSettings } from '../../../lib/supervision/settings';

export const GET: APIRoute = ({ url, locals }) =>
  handle(async () => json(await readClinicSettings(signedIn(locals), url.searchParams.get('clinicId') ?? undefined)));

export const PUT: APIRoute = ({ url, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const thresholds = await readJson(request, clinicSettingsInputSchema);
    return json(await saveClinicSettings(ctx, thresholds, url.searchParams.get('clinicId') ?? undefined));
  });

export const PATCH: APIRoute = ({ url, request, locals }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    const { locale } = await readJson(request, clinicLocaleSchema);
    return json(await saveClinicLocale(ctx, locale, url.searchParams.get('clinicId') ?? undefined));
  });
