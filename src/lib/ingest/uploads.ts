import { z } from 'zod';
import { canDownloadRaw, canReprocess } from '../auth/access';
import type { RequestContext } from '../auth/context';
import { config } from '../config';
import { scope, type ClientGrant, type Db } from '../data';
import type { UploadRow } from '../db/tables';
import { badRequest, forbidden, HttpError } from '../http/errors';
import { deleteObjects, getObjectStream } from '../storage/s3';
import { cleanFileName } from './file-name';
import { receiveRideFiles } from './receive';
import { enqueueParse, registerUploads } from './register';

const uuid = z.string().uuid();
const instant = z.string().datetime({ offset: true });

export function uploadView(row: UploadRow) {
  return {
    id: row.id,
    clientId: row.client_id,
    name: cleanFileName(row.original_name),
    byteSize: Number(row.byte_size),
    sha256: row.sha256,
    status: row.status,
    sessionId: row.ride_id,
    duplicateOf: row.duplicate_of_ride_id,
    duplicateOfUpload: row.duplicate_of_upload_id,
    error: row.error,
    warnings: row.warnings,
    uploadedAt: row.uploaded_at.toISOString(),
    processedAt: row.processed_at?.toISOString() ?? null,
  };
}

/** The per-file answer of POST /api/uploads. */
function fileResult(row: UploadRow) {
  return {
    name: cleanFileName(row.original_name),
    uploadId: row.id,
    status: row.status,
    ...(row.ride_id ? { sessionId: row.ride_id } : {}),
    ...(row.status === 'duplicate' ? { duplicateOf: row.duplicate_of_ride_id } : {}),
    ...(row.error ? { error: row.error } : {}),
  };
}

function one(fields: Record<string, string[]>, name: string): string | undefined {
  const v = fields[name];
  if (v && v.length > 1) throw badRequest(`Send "${name}" once.`);
  return v?.[0];
}

/** The form fields an upload may carry besides its files, checked before any byte is stored and again at the end. */
interface UploadFields {
  clientId: string;
  importProfileId: string | null;
  fallback: Date[];
}

function readFields(fields: Record<string, string[]>): UploadFields {
  const clientId = one(fields, 'clientId');
  if (!clientId || !uuid.safeParse(clientId).success) throw badRequest('Say which client the files are for: send the field "clientId" before the files.');
  const fallback = (fields.fallbackStartedAt ?? []).map((v, i) => {
    if (!instant.safeParse(v).success) throw badRequest(`fallbackStartedAt value ${i + 1} ("${v.slice(0, 40)}") is not an ISO 8601 date-time such as 2026-10-05T09:30:00Z.`);
    return new Date(v);
  });
  const importProfileId = one(fields, 'importProfileId') || null;
  if (importProfileId && !uuid.safeParse(importProfileId).success) throw badRequest(unknownProfile);
  return { clientId, importProfileId, fallback };
}

const unknownProfile = 'That import profile does not exist for this client’s clinic. Choose another or leave it on automatic detection.';

/** Bytes of ride files a clinic stores (an object shared by copies of the same file counts once). */
async function storedBytes(db: Db, clinicId: string): Promise<number> {
  const sharedOnce = db('uploads').where({ clinic_id: clinicId }).distinctOn('storage_key').select('id');
  const row = await db('uploads').whereIn('id', sharedOnce).sum('byte_size as bytes').first();
  return Number(row?.bytes ?? 0);
}

const size = (bytes: number) => (bytes >= 1024 ** 3 ? `${(bytes / 1024 ** 3).toFixed(1)} GB` : `${(bytes / 1024 ** 2).toFixed(1)} MB`);

function quotaExceeded(used: number, quota: number): HttpError {
  return new HttpError(
    507,
    'storage_quota_exceeded',
    `The clinic’s storage for ride files is full (${size(used)} of ${size(quota)} used), so nothing from this upload was saved. Ask the clinic administrator; the limit is set by whoever runs Kinloop for the clinic.`,
  );
}

/**
 * Streams the files of a multipart request to storage for the client named in
 * the `clientId` field, records them, and waits a little for the worker so
 * that most answers are final rather than `queued`. Every field that came
 * before the files is checked before the first byte is stored; a refusal after
 * that deletes what was stored.
 */
export async function uploadRideFiles(ctx: RequestContext, request: Request, waitMs: number) {
  let grant: ClientGrant | null = null;
  let used = 0;
  const quota = config().clinicStorageQuotaBytes;
  const received = await receiveRideFiles(request, async (fields, declaredBytes) => {
    const early = readFields(fields);
    const client = await scope(ctx).client(early.clientId, 'contribute', 'upload.create');
    grant = client;
    if (early.importProfileId) await checkProfile(client, early.importProfileId);
    // The clinic's use counts every client's files, which the uploader cannot see.
    used = await storedBytes(client.system('the clinic’s storage quota'), client.clinicId);
    if (used + declaredBytes > quota) throw quotaExceeded(used, quota);
    return `rides/${client.clinicId}/${client.id}`;
  });
  const client = grant as ClientGrant | null;
  if (!client) throw new Error('the upload was received without its client');
  const keys = received.files.map((f) => f.storageKey);
  let rows: UploadRow[];
  try {
    const { fallback, importProfileId } = readFields(received.fields);
    if (fallback.length > 1 && fallback.length !== received.files.length) {
      throw badRequest(`Send one fallbackStartedAt for all files or one per file; got ${fallback.length} for ${received.files.length} files.`);
    }
    if (importProfileId) await checkProfile(client, importProfileId);
    const added = received.files.reduce((sum, f) => sum + f.byteSize, 0);
    if (used + added > quota) throw quotaExceeded(used, quota);
    rows = await registerUploads(client.db, {
      clientId: client.id,
      clinicId: client.clinicId,
      userId: ctx.viewer.userId,
      importProfileId,
      files: received.files.map((f, i) => ({ ...f, fallbackStartedAt: fallback.length === 1 ? fallback[0] : (fallback[i] ?? null) })),
    });
  } catch (err) {
    // A refusal after the files arrived leaves no object behind: no row was made.
    await deleteObjects(keys);
    throw err;
  }
  // Bytes the client had sent before share the first copy's object: the one just stored goes.
  await deleteObjects(keys.filter((k) => !rows.some((r) => r.storage_key === k)));
  const settled = await waitForOutcome(ctx, rows, waitMs);
  return { files: settled.map(fileResult) };
}

async function checkProfile(client: ClientGrant, profileId: string): Promise<void> {
  const ok = await client.db('import_profiles').where({ id: profileId, clinic_id: client.clinicId }).whereNull('archived_at').first('id');
  if (!ok) throw badRequest(unknownProfile);
}

async function waitForOutcome(ctx: RequestContext, rows: UploadRow[], waitMs: number): Promise<UploadRow[]> {
  const deadline = Date.now() + waitMs;
  let current = rows;
  while (current.some((r) => r.status === 'queued') && Date.now() < deadline) {
    await new Promise((r) => setTimeout(r, 150));
    const fresh = await scope(ctx).uploads().whereIn('id', rows.map((r) => r.id));
    current = rows.map((r) => fresh.find((f) => f.id === r.id)!);
  }
  return current;
}

const uploadFor = (ctx: RequestContext, id: string, action: string) => scope(ctx).record('upload', id, 'read', action, { uploadId: id });

export async function listUploads(ctx: RequestContext, clientId: string, limit = 100) {
  const client = await scope(ctx).client(clientId, 'read', 'uploads.list');
  const rows: UploadRow[] = await client.db('uploads').orderBy('uploaded_at', 'desc').limit(limit);
  // The same rule as reprocessUpload, for the files whose reading failed.
  return rows.map((row) => ({ ...uploadView(row), canTryAgain: row.status === 'failed' && canReprocess(ctx.viewer, row, client.row) }));
}

export async function readUpload(ctx: RequestContext, id: string) {
  return uploadView((await uploadFor(ctx, id, 'upload.view')).row);
}

/** The stored bytes exactly as uploaded, for the uploader and the client's clinic staff. */
export async function rawUpload(ctx: RequestContext, id: string) {
  const { row, client } = await uploadFor(ctx, id, 'upload.download');
  if (!canDownloadRaw(ctx.viewer, row, client.row)) throw forbidden('Only the person who uploaded a file and the client’s clinic can download it.');
  const { body, length } = await getObjectStream(row.storage_key);
  return { row, body, length };
}

/**
 * Queues a stored file for reading again; its session is replaced, never
 * duplicated. The clinic's staff may do it for any file (after an import
 * profile changed); the person who uploaded a file may try again one that failed.
 */
export async function reprocessUpload(ctx: RequestContext, id: string) {
  const { row, client } = await uploadFor(ctx, id, 'upload.reprocess');
  if (!canReprocess(ctx.viewer, row, client.row)) {
    throw forbidden('Only the client’s clinic can have a file read again; the person who uploaded a file can try again when reading it failed.');
  }
  if (row.status === 'queued') return uploadView(row);
  let target = row;
  if (row.duplicate_of_upload_id) {
    const original: UploadRow | undefined = await client.db('uploads').where({ id: row.duplicate_of_upload_id }).first();
    // A copy that failed with its first copy is tried again through that one; any other copy has nothing of its own to read.
    if (!original || row.status !== 'failed' || original.status !== 'failed') {
      throw badRequest('This upload is a copy of an earlier file with the same bytes; reprocess that one instead.', { originalUploadId: row.duplicate_of_upload_id });
    }
    target = original;
  }
  // canReprocess allowed it: the change is made as a contributor to the client (the same request's access, audited once).
  const writer = await scope(ctx).client(client.id, 'contribute', 'upload.reprocess');
  await writer.db.transaction(async (trx) => {
    await trx('uploads').where({ id: target.id }).update({ status: 'queued', enqueued_at: trx.fn.now(), error: null, attempts: 0 });
    if (target.id !== row.id) await trx('uploads').where({ id: row.id }).update({ status: 'queued', enqueued_at: trx.fn.now(), error: null });
  });
  await scope(ctx).audit({ action: 'upload.reprocess_queued', clientId: row.client_id, recordType: 'upload', recordId: target.id });
  await enqueueParse([target.id]);
  return uploadView({ ...row, status: 'queued', error: null });
}
