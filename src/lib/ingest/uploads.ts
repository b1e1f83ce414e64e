import { z } from 'zod';
import { accessClient, accessClientRecord, canManageClient } from '../auth/access';
import { auditAs, type RequestContext } from '../auth/context';
import type { UploadRow } from '../db/tables';
import { badRequest, forbidden } from '../http/errors';
import { getObjectStream } from '../storage/s3';
import { receiveRideFiles } from './receive';
import { enqueueParse, registerUploads } from './register';

const uuid = z.string().uuid();
const instant = z.string().datetime({ offset: true });

export function uploadView(row: UploadRow) {
  return {
    id: row.id,
    clientId: row.client_id,
    name: row.original_name,
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
    name: row.original_name,
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

/**
 * Streams the files of a multipart request to storage for the client named in
 * the `clientId` field, records them, and waits a little for the worker so
 * that most answers are final rather than `queued`.
 */
export async function uploadRideFiles(ctx: RequestContext, request: Request, waitMs: number) {
  let clinicId = '';
  let clientId = '';
  const received = await receiveRideFiles(
    request,
    () => `rides/${clinicId}/${clientId}`,
    async (fields) => {
      const id = one(fields, 'clientId');
      if (!id || !uuid.safeParse(id).success) throw badRequest('Say which client the files are for: send the field "clientId" before the files.');
      const client = await accessClient(ctx, id, 'contribute', 'upload.create');
      clinicId = client.clinic_id;
      clientId = client.id;
    },
  );
  const fallback = (received.fields.fallbackStartedAt ?? []).map((v, i) => {
    if (!instant.safeParse(v).success) throw badRequest(`fallbackStartedAt value ${i + 1} ("${v.slice(0, 40)}") is not an ISO 8601 date-time such as 2026-10-05T09:30:00Z.`);
    return new Date(v);
  });
  if (fallback.length > 1 && fallback.length !== received.files.length) {
    throw badRequest(`Send one fallbackStartedAt for all files or one per file; got ${fallback.length} for ${received.files.length} files.`);
  }
  const profileId = one(received.fields, 'importProfileId') || null;
  if (profileId) {
    const ok = uuid.safeParse(profileId).success && (await ctx.knex('import_profiles').where({ id: profileId, clinic_id: clinicId }).whereNull('archived_at').first('id'));
    if (!ok) throw badRequest('That import profile does not exist for this client’s clinic. Choose another or leave it on automatic detection.');
  }
  const rows = await registerUploads(ctx.knex, {
    clientId,
    clinicId,
    userId: ctx.viewer.userId,
    importProfileId: profileId,
    files: received.files.map((f, i) => ({ ...f, fallbackStartedAt: fallback.length === 1 ? fallback[0] : (fallback[i] ?? null) })),
  });
  const settled = await waitForOutcome(ctx, rows, waitMs);
  return { files: settled.map(fileResult) };
}

async function waitForOutcome(ctx: RequestContext, rows: UploadRow[], waitMs: number): Promise<UploadRow[]> {
  const deadline = Date.now() + waitMs;
  let current = rows;
  while (current.some((r) => r.status === 'queued') && Date.now() < deadline) {
    await new Promise((r) => setTimeout(r, 150));
    const fresh = await ctx.knex<UploadRow>('uploads').whereIn('id', rows.map((r) => r.id));
    current = rows.map((r) => fresh.find((f) => f.id === r.id)!);
  }
  return current;
}

async function uploadFor(ctx: RequestContext, id: string, need: 'read' | 'manage', action: string) {
  const found = uuid.safeParse(id).success ? await ctx.knex<UploadRow>('uploads').where({ id }).first() : undefined;
  const { row } = await accessClientRecord(ctx, found, { what: 'That upload', type: 'upload', id }, need, action, { uploadId: id });
  return row;
}

export async function listUploads(ctx: RequestContext, clientId: string, limit = 100) {
  const client = await accessClient(ctx, clientId, 'read', 'uploads.list');
  const rows = await ctx.knex<UploadRow>('uploads').where({ client_id: client.id }).orderBy('uploaded_at', 'desc').limit(limit);
  return rows.map(uploadView);
}

export async function readUpload(ctx: RequestContext, id: string) {
  return uploadView(await uploadFor(ctx, id, 'read', 'upload.view'));
}

/** The stored bytes exactly as uploaded, for the uploader and the client's clinic staff. */
export async function rawUpload(ctx: RequestContext, id: string) {
  const row = await uploadFor(ctx, id, 'read', 'upload.download');
  const client = await ctx.knex('clients').where({ id: row.client_id }).first('clinic_id');
  if (row.uploaded_by !== ctx.viewer.userId && !canManageClient(ctx.viewer, client)) throw forbidden('Only the person who uploaded a file and the client’s clinic can download it.');
  const { body, length } = await getObjectStream(row.storage_key);
  return { row, body, length };
}

/** Queues a stored file for parsing again; its session is replaced, never duplicated. */
export async function reprocessUpload(ctx: RequestContext, id: string) {
  const row = await uploadFor(ctx, id, 'manage', 'upload.reprocess');
  if (row.duplicate_of_upload_id) {
    throw badRequest('This upload is a copy of an earlier file with the same bytes; reprocess that one instead.', { originalUploadId: row.duplicate_of_upload_id });
  }
  await ctx.knex('uploads').where({ id }).update({ status: 'queued', enqueued_at: ctx.knex.fn.now(), error: null });
  await auditAs(ctx, { action: 'upload.reprocess_queued', clientId: row.client_id, recordType: 'upload', recordId: id });
  await enqueueParse([id]);
  return uploadView({ ...row, status: 'queued', error: null });
}
