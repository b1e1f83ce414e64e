import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import type { DeviceRow, ImportProfileRow } from '../db/tables';
import { badRequest, notFound } from '../http/errors';
import { parseRide } from '../rides/parse';
import type { ImportProfile } from '../rides/types';
import type { ProfileInput } from './schema';
import type { z } from 'zod';
import type { deviceInputSchema, previewInputSchema } from './schema';

const PREVIEW_ROWS = 12;

export function profileView(row: ImportProfileRow) {
  return {
    id: row.id,
    clinicId: row.clinic_id,
    name: row.name,
    deviceName: row.device_name,
    columns: row.mapping.columns,
    metresPerRev: row.mapping.metresPerRev ?? null,
    timeFormat: row.mapping.timeFormat ?? null,
    updatedAt: row.updated_at.toISOString(),
  };
}

function mappingOf(input: Pick<ProfileInput, 'columns' | 'metresPerRev' | 'timeFormat'> & { name?: string }): ImportProfile {
  return {
    name: input.name ?? 'preview',
    columns: input.columns,
    ...(input.metresPerRev !== undefined ? { metresPerRev: input.metresPerRev } : {}),
    ...(input.timeFormat ? { timeFormat: input.timeFormat } : {}),
  };
}

/** Profiles of every clinic the caller works with or belongs to through a client, for choosing one at upload. */
export async function listProfiles(ctx: RequestContext) {
  const rows: ImportProfileRow[] = await scope(ctx).profiles().whereNull('archived_at').orderBy('name');
  return rows.map(profileView);
}

export async function createProfile(ctx: RequestContext, input: ProfileInput) {
  const clinic = scope(ctx).clinic(['admin'], input.clinicId);
  const [row] = await clinic.db<ImportProfileRow>('import_profiles')
    .insert({ name: input.name, device_name: input.deviceName ?? null, mapping: JSON.stringify(mappingOf(input)) as unknown as ImportProfile, created_by: ctx.viewer.userId })
    .returning('*');
  await clinic.audit({ action: 'import_profile.create', recordType: 'import_profile', recordId: row.id });
  return profileView(row);
}

/** A profile of a clinic where the caller is staff (else 404), for its admins (else 403). */
async function ownProfile(ctx: RequestContext, id: string) {
  const s = scope(ctx);
  const row: ImportProfileRow | undefined = /^[0-9a-f-]{36}$/i.test(id) ? await s.profiles().where({ id }).whereNull('archived_at').first() : undefined;
  if (!row || !ctx.viewer.memberships.some((m) => m.clinicId === row.clinic_id)) throw notFound('That import profile');
  return { row, clinic: s.clinic(['admin'], row.clinic_id) };
}

export async function updateProfile(ctx: RequestContext, id: string, input: ProfileInput) {
  const { row, clinic } = await ownProfile(ctx, id);
  const [updated] = await clinic.db<ImportProfileRow>('import_profiles')
    .where({ id: row.id })
    .update({ name: input.name, device_name: input.deviceName ?? null, mapping: JSON.stringify(mappingOf(input)) as unknown as ImportProfile, updated_at: clinic.db.fn.now() as unknown as Date })
    .returning('*');
  await clinic.audit({ action: 'import_profile.update', recordType: 'import_profile', recordId: id });
  return profileView(updated);
}

/** Archived, not deleted: uploads that used it still say which mapping read them. */
export async function archiveProfile(ctx: RequestContext, id: string) {
  const { row, clinic } = await ownProfile(ctx, id);
  await clinic.transaction(async (tx) => {
    await tx.db('import_profiles').where({ id: row.id }).update({ archived_at: tx.db.fn.now() });
    await tx.db('devices').where({ import_profile_id: row.id }).update({ import_profile_id: null });
  });
  await clinic.audit({ action: 'import_profile.archive', recordType: 'import_profile', recordId: id });
}

/** How the first rows of a sample file would be read, with or without a draft profile. */
export function previewProfile(input: z.infer<typeof previewInputSchema>) {
  const bytes = Buffer.from(input.sampleBase64, 'base64');
  const profile = input.profile?.columns ? mappingOf({ ...input.profile, columns: input.profile.columns }) : undefined;
  const parsed = parseRide(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength), { profile, metresPerRev: input.profile?.metresPerRev });
  if (!parsed.ok) return { ok: false as const, error: parsed.error };
  const s = parsed.series;
  const n = Math.min(PREVIEW_ROWS, s.t.length);
  const fields: [string, Float64Array | undefined][] = [
    ['cadenceRpm', s.cadenceRpm],
    ['powerW', s.powerW],
    ['distanceM', s.distanceM],
    ['heartRateBpm', s.heartRateBpm],
    ['pulseWidthUs', s.pulseWidthUs],
    ['frequencyHz', s.frequencyHz],
    ...Object.entries(s.channels).map(([k, v]) => [`${k} (mA)`, v] as [string, Float64Array]),
  ];
  const present = fields.filter(([, v]) => v) as [string, Float64Array][];
  const nullable = (v: number) => (Number.isNaN(v) ? null : v);
  return {
    ok: true as const,
    encoding: parsed.metadata.encoding,
    delimiter: parsed.metadata.delimiter,
    decimalComma: parsed.metadata.decimalComma,
    headerLine: parsed.metadata.headerLine,
    columns: parsed.metadata.columns,
    deviceSerial: parsed.metadata.deviceSerial,
    startedAt: parsed.summary.startedAt,
    fields: ['t (s)', 'phase', ...present.map(([k]) => k)],
    rows: Array.from({ length: n }, (_, i) => [s.t[i], s.phase[i], ...present.map(([, v]) => nullable(v[i]))]),
    warnings: parsed.summary.warnings,
  };
}

export function deviceView(row: DeviceRow) {
  return { id: row.id, clinicId: row.clinic_id, serial: row.serial, name: row.name, importProfileId: row.import_profile_id };
}

export async function listDevices(ctx: RequestContext) {
  const rows: DeviceRow[] = await scope(ctx).devices().orderBy('serial');
  return rows.map(deviceView);
}

/** Registers a device serial (or updates it), optionally attaching the profile its files are read with. */
export async function saveDevice(ctx: RequestContext, input: z.infer<typeof deviceInputSchema>) {
  const clinic = scope(ctx).clinic(['admin'], input.clinicId);
  if (input.importProfileId) {
    const p = await clinic.db('import_profiles').where({ id: input.importProfileId }).whereNull('archived_at').first('id');
    if (!p) throw badRequest('That import profile does not exist in this clinic.', { fields: [{ path: 'importProfileId', message: 'Choose one of the clinic’s profiles.' }] });
  }
  const [row] = await clinic.db<DeviceRow>('devices')
    .insert({ serial: input.serial, name: input.name ?? null, import_profile_id: input.importProfileId ?? null })
    .onConflict(['clinic_id', 'serial'])
    .merge(['name', 'import_profile_id'])
    .returning('*');
  await clinic.audit({ action: 'device.save', recordType: 'device', recordId: row.id });
  return deviceView(row);
}
