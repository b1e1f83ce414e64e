// The parse job: turns a stored ride file into a session, or marks the upload
// rejected with the parser's error. The file itself is never touched, so a
// rejected upload can be parsed again later (after an import profile changed).
import { lock, type Db, type Query } from '../data/db';
import type { ClientRow, DeviceRow, ImportProfileRow, RideRow, StartedAtSource, UploadRow } from '../db/tables';
import { readRideFile, type RideReading } from '../rides/reading';
import { SERIES_FORMAT } from '../rides/series-codec';
import type { ImportProfile, ParseOptions, RideSummary } from '../rides/types';
import { getObjectBytes } from '../storage/s3';
import { enqueueParse, settleFollowers } from './register';
import { notifyRidesChanged } from './ride-events';
import { sessionStart } from './start-time';

/** Two sessions of one client starting this close together are the same ride. */
export const NEAR_DUPLICATE_MS = 2 * 60_000;

export type ProcessOutcome = 'accepted' | 'duplicate' | 'rejected' | 'skipped';

/** Reads a ride file's bytes; the worker does it in a parse process of its own, scripts in their own process. */
export type RideReader = (bytes: Uint8Array, options: ParseOptions) => Promise<RideReading>;

export const readInThisProcess: RideReader = async (bytes, options) => readRideFile(bytes, options);

export async function processUpload(knex: Db, uploadId: string, read: RideReader = readInThisProcess): Promise<ProcessOutcome> {
  const upload = await knex<UploadRow>('uploads').where({ id: uploadId }).first();
  if (!upload || upload.status !== 'queued') return 'skipped';
  await knex('uploads').where({ id: uploadId }).increment('attempts', 1);
  const [client, bytes] = await Promise.all([
    knex<ClientRow>('clients').where({ id: upload.client_id }).first(),
    // A storage error here is transient: the job fails and the queue retries it.
    getObjectBytes(upload.storage_key),
  ]);
  if (!client) throw new Error(`client ${upload.client_id} of upload ${uploadId} is missing`);

  const chosen = upload.import_profile_id ? await profileById(knex, upload.import_profile_id) : null;
  const parse = (profile: ImportProfileRow | null) => read(bytes, { profile: profile?.mapping, timeZone: client.time_zone, metresPerRev: profile?.mapping.metresPerRev });
  let reading = await parse(chosen);
  // A profile attached to the file's device applies when none was chosen at
  // upload; the serial is read even from a file the built-in words refuse.
  const serial = reading.ok ? reading.metadata.deviceSerial : reading.deviceSerial;
  const device = serial ? ((await knex<DeviceRow>('devices').where({ clinic_id: upload.clinic_id, serial }).first()) ?? null) : null;
  if (device?.import_profile_id && !chosen) {
    const profile = await profileById(knex, device.import_profile_id);
    if (profile) reading = await parse(profile);
  }

  if (!reading.ok) {
    const error = reading.error;
    const placed = await knex.transaction(async (trx) => {
      if (!(await stillQueued(trx, uploadId))) return null;
      await trx('uploads').where({ id: uploadId }).update({ status: 'rejected', error: JSON.stringify(error), processed_at: trx.fn.now() });
      // The session made from this file before is derived data: it goes, the file stays.
      const orphaned = upload.ride_id ? await dropRide(trx, upload.ride_id) : [];
      await settleFollowers(trx, uploadId);
      return orphaned;
    });
    if (placed === null) return 'skipped';
    await enqueueParse(placed);
    if (upload.ride_id) await notifyRidesChanged(knex, client.id);
    return 'rejected';
  }

  const start = sessionStart({ fileStartedAt: reading.summary.startedAt, fallbackStartedAt: upload.fallback_started_at, uploadedAt: upload.uploaded_at, timeZone: client.time_zone });
  const { startedAt, source } = start;
  const warnings = [...reading.summary.warnings, ...start.warnings];
  const outcome = await knex.transaction(async (trx) => {
    // One client's files are placed one at a time, so two copies of a ride
    // parsed at once cannot both become sessions.
    await lock(trx, `rides:${client.id}`);
    // A second job for the same upload (a message re-sent by the sweeper) may have placed it meanwhile.
    if (!(await stillQueued(trx, uploadId))) return 'skipped' as const;
    const near = await trx<RideRow>('rides')
      .where({ client_id: client.id })
      .whereNot({ upload_id: uploadId })
      .whereBetween('started_at', [new Date(startedAt.getTime() - NEAR_DUPLICATE_MS), new Date(startedAt.getTime() + NEAR_DUPLICATE_MS)])
      .orderBy('started_at')
      .first('id');
    if (near) {
      await trx('uploads').where({ id: uploadId }).update({ status: 'duplicate', duplicate_of_ride_id: near.id, error: null, warnings: JSON.stringify(warnings), processed_at: trx.fn.now() });
      if (upload.ride_id) await trx('rides').where({ id: upload.ride_id }).delete();
      await settleFollowers(trx, uploadId);
      return 'duplicate' as const;
    }
    const rideId = await saveRide(trx, { upload, client, device, summary: reading.summary, series: reading.series, startedAt, source, warnings });
    await trx('uploads').where({ id: uploadId }).update({ status: 'accepted', ride_id: rideId, error: null, warnings: JSON.stringify(warnings), processed_at: trx.fn.now() });
    await settleFollowers(trx, uploadId);
    return 'accepted' as const;
  });
  if (outcome !== 'skipped') await notifyRidesChanged(knex, client.id);
  return outcome;
}

/** Locks the upload's row for this transaction; false when another job has settled it meanwhile. */
async function stillQueued(trx: Db, uploadId: string): Promise<boolean> {
  const row = await trx<UploadRow>('uploads').where({ id: uploadId }).forUpdate().first('status');
  return row?.status === 'queued';
}

/**
 * Deletes a session whose file is now refused. Other files that were kept as
 * near-duplicates of it (a different file of the same ride) lose what they
 * were a duplicate of, so they are queued to be read again: one of them may
 * now be the session. Returns their ids, to send their jobs after the commit.
 */
async function dropRide(trx: Db, rideId: string): Promise<string[]> {
  const near = await trx<UploadRow>('uploads')
    .where({ duplicate_of_ride_id: rideId, status: 'duplicate' })
    .whereNull('duplicate_of_upload_id')
    .update({ status: 'queued', duplicate_of_ride_id: null, enqueued_at: trx.fn.now(), processed_at: null })
    .returning('id');
  await trx('rides').where({ id: rideId }).delete();
  return near.map((r: { id: string }) => r.id);
}

async function profileById(knex: Db, id: string): Promise<(ImportProfileRow & { mapping: ImportProfile }) | null> {
  return (await knex<ImportProfileRow>('import_profiles').where({ id }).whereNull('archived_at').first()) ?? null;
}

/** Writes the session and its series (encoded); a reprocessed upload replaces its own session in place. */
export async function saveRide(
  trx: Db,
  p: { upload: UploadRow; client: ClientRow; device: DeviceRow | null; summary: RideSummary; series: Uint8Array; startedAt: Date; source: StartedAtSource; warnings: string[] },
): Promise<string> {
  const s = p.summary;
  const columns = {
    client_id: p.client.id,
    clinic_id: p.client.clinic_id,
    upload_id: p.upload.id,
    device_id: p.device?.id ?? null,
    started_at: p.startedAt,
    started_at_source: p.source,
    duration_s: s.durationS,
    active_s: s.activeS,
    passive_s: s.passiveS,
    cooldown_s: s.cooldownS,
    distance_m: s.distanceM,
    mean_power_w: s.meanPowerW,
    peak_power_5s_w: s.peakPower5sW,
    work_kj: s.workKj,
    mean_cadence_rpm: s.meanCadenceRpm,
    current_per_watt_ma_per_w: s.currentPerWattMaPerW,
    pulse_width_us: s.pulseWidthUs,
    frequency_hz: s.frequencyHz,
    samples: s.samples,
    channels: JSON.stringify(s.channels),
    warnings: JSON.stringify(p.warnings),
  };
  const existing = p.upload.ride_id ? await trx<RideRow>('rides').where({ id: p.upload.ride_id }).first('id') : undefined;
  let rideId: string;
  if (existing) {
    await trx('rides').where({ id: existing.id }).update({ ...columns, updated_at: trx.fn.now() });
    rideId = existing.id;
  } else {
    const [row] = await trx('rides').insert(columns).returning('id');
    rideId = row.id;
  }
  const data = Buffer.from(p.series.buffer, p.series.byteOffset, p.series.byteLength);
  await trx('ride_series')
    .insert({ ride_id: rideId, format: SERIES_FORMAT, samples: s.samples, data })
    .onConflict('ride_id')
    .merge();
  return rideId;
}
