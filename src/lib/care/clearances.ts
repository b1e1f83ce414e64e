// Medical clearance: the physician's document, streamed to object storage
// through the same receiving code as ride files (src/lib/ingest/receive.ts),
// with its date, the clearing clinician and a review date. Staff only.
import { DateTime } from 'luxon';
import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import { HttpError, badRequest, notFound } from '../http/errors';
import { discardRest } from '../http/request';
import { cleanFileName } from '../ingest/file-name';
import { receiveFiles, type ReceiveRules } from '../ingest/receive';
import { deleteObjects, getObjectStream } from '../storage/s3';
import { calendarDate, line } from '../validation/fields';
import { clinicCareSettings } from './care-settings';
import { localDate } from '../time/local-date';

export const MAX_CLEARANCE_BYTES = 10 * 1024 * 1024;

const refusedType = (name: string) =>
  new HttpError(415, 'unsupported_document', `"${name}" is not a PDF, JPEG or PNG file (Kinloop reads the file's first bytes, not its name). Nothing was saved; scan or save the clearance as one of those and upload it again.`);

/** PDF, JPEG or PNG, told by their signatures (ISO 32000 "%PDF-", JFIF/EXIF FF D8 FF, PNG's eight bytes). */
export function documentType(head: Buffer): 'application/pdf' | 'image/jpeg' | 'image/png' | null {
  if (head.length >= 5 && head.subarray(0, 5).toString('latin1') === '%PDF-') return 'application/pdf';
  if (head.length >= 3 && head[0] === 0xff && head[1] === 0xd8 && head[2] === 0xff) return 'image/jpeg';
  if (head.length >= 8 && head.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return 'image/png';
  return null;
}

const CLEARANCE_FILES: ReceiveRules = {
  field: 'document',
  maxFileBytes: MAX_CLEARANCE_BYTES,
  maxFiles: 1,
  what: 'clearance document',
  contentType: 'application/octet-stream',
  tooLarge: (name) => new HttpError(413, 'too_large', `"${name}" is larger than 10 MB, the most Kinloop accepts for a clearance document. Nothing was saved; scan it at a lower resolution or save it as a PDF.`),
  sniff: (head, name) => {
    const type = documentType(head);
    if (!type) throw refusedType(name);
    return type;
  },
};

export const clearanceFieldsSchema = z
  .object({
    clearedOn: calendarDate('Cleared on'),
    clinician: line(z.string().trim().min(1, 'Clinician: name the clinician who gave the clearance.').max(200, 'Clinician: at most 200 characters.'), 'Clinician'),
    reviewOn: calendarDate('Review on').optional(),
  })
  .strict()
  .refine((v) => !v.reviewOn || v.reviewOn > v.clearedOn, { path: ['reviewOn'], message: 'Review on: choose a day after the clearance.' });

function fieldsOf(fields: Record<string, string[]>) {
  const out: Record<string, string> = {};
  for (const [name, values] of Object.entries(fields)) {
    if (values.length > 1) throw badRequest(`Send "${name.slice(0, 40)}" once.`);
    if (values[0] !== '') out[name] = values[0];
  }
  return clearanceFieldsSchema.parse(out);
}

export function clearanceView(row: {
  id: string;
  client_id: string;
  original_name: string;
  content_type: string;
  byte_size: string | number;
  sha256: string;
  cleared_on: string;
  clinician: string;
  review_on: string;
  uploaded_by: string;
  uploaded_by_name?: string;
  created_at: Date;
}) {
  return {
    id: row.id,
    clientId: row.client_id,
    name: cleanFileName(row.original_name),
    contentType: row.content_type,
    byteSize: Number(row.byte_size),
    sha256: row.sha256,
    clearedOn: row.cleared_on,
    clinician: row.clinician,
    reviewOn: row.review_on,
    uploadedBy: { userId: row.uploaded_by, name: row.uploaded_by_name ?? null },
    uploadedAt: row.created_at.toISOString(),
    downloadUrl: `/api/clients/${row.client_id}/clearances/${row.id}`,
  };
}

/**
 * Stores one clearance document with its details. Access is checked before
 * the first byte is stored; details sent after the file are checked at the
 * end, and a refusal then deletes the stored object.
 */
export async function uploadClearance(ctx: RequestContext, clientId: string, request: Request) {
  let client;
  try {
    client = await scope(ctx).client(clientId, 'manage', 'clearance.create');
  } catch (err) {
    // Refused before the body was read: it is dropped, so that the answer reaches the caller.
    if (request.body) discardRest(request.body.getReader());
    throw err;
  }
  const received = await receiveFiles(request, CLEARANCE_FILES, async () => `clearances/${client.clinicId}/${client.id}`);
  const file = received.files[0];
  try {
    const input = fieldsOf(received.fields);
    if (input.clearedOn > localDate(new Date(), client.row.time_zone)) {
      throw badRequest('Cleared on: the clearance cannot be dated in the future.', { fields: [{ path: 'clearedOn', message: 'Choose today or an earlier day.' }] });
    }
    const settings = await clinicCareSettings(client.db, client.clinicId);
    const reviewOn = input.reviewOn ?? DateTime.fromISO(input.clearedOn, { zone: 'UTC' }).plus({ months: settings.clearanceReviewMonths }).toISODate()!;
    const row = await client.transaction(async (tx) => {
      const [created] = await tx.db('clearances')
        .insert({
          storage_key: file.storageKey,
          sha256: file.sha256,
          byte_size: file.byteSize,
          content_type: file.contentType,
          original_name: file.name,
          cleared_on: input.clearedOn,
          clinician: input.clinician,
          review_on: reviewOn,
          uploaded_by: ctx.viewer.userId,
        })
        .returning('*');
      await tx.audit({ action: 'clearance.upload', recordType: 'clearance', recordId: created.id, detail: { clearedOn: input.clearedOn, reviewOn, sha256: file.sha256 } });
      return created;
    });
    return clearanceView({ ...row, uploaded_by_name: ctx.viewer.name });
  } catch (err) {
    await deleteObjects([file.storageKey]);
    throw err;
  }
}

export async function listClearances(ctx: RequestContext, clientId: string) {
  const client = await scope(ctx).client(clientId, 'manage', 'clearances.list');
  const rows = await client.db('clearances as c').join('users as u', 'u.id', 'c.uploaded_by').orderBy('c.created_at', 'desc').select('c.*', 'u.name as uploaded_by_name');
  return { clearances: rows.map(clearanceView) };
}

/** The stored document, for the client's clinic staff. */
export async function clearanceDocument(ctx: RequestContext, clientId: string, clearanceId: string) {
  const { row } = await scope(ctx).record('clearance', clearanceId, 'manage', 'clearance.download');
  // A document of another of the caller's clients, asked for under this one: the same answer as a missing one.
  if (row.client_id !== clientId) throw notFound('That clearance document');
  const { body, length } = await getObjectStream(row.storage_key);
  return { row, body, length };
}
