// Housekeeping of ride files, run by the worker: uploads whose job was lost
// are sent again, uploads that could not be read after every try are marked
// failed, and stored objects that no upload names are deleted.
import type { Db, Query } from '../data/db';
import type { UploadRow } from '../db/tables';
import { deleteObjects, listObjects } from '../storage/s3';
import { markUploadFailed } from './failures';
import { enqueueParse } from './register';

/** Uploads left queued this long get their parse job sent again (its message may have been lost in a crash). */
export const RESEND_AFTER_MS = 10 * 60_000;
/** Attempts after which an upload still queued is failed, not sent again: the queue's own seven tries and then some. */
export const MAX_READ_ATTEMPTS = 7;
/** Objects younger than this may belong to an upload still in progress. */
export const ORPHAN_AFTER_MS = 60 * 60_000;

export async function resendStaleUploads(knex: Db, now = new Date()): Promise<{ resent: number; failed: number }> {
  const stale = await knex<UploadRow>('uploads')
    .where({ status: 'queued' })
    .whereNull('duplicate_of_upload_id')
    .where('enqueued_at', '<', new Date(now.getTime() - RESEND_AFTER_MS))
    .orderBy('enqueued_at')
    .limit(100)
    .select('id', 'attempts');
  const exhausted = stale.filter((u) => u.attempts >= MAX_READ_ATTEMPTS);
  for (const u of exhausted) {
    await markUploadFailed(knex, u.id, `Kinloop started reading this file ${u.attempts} times and never finished.`);
  }
  const resend = stale.filter((u) => u.attempts < MAX_READ_ATTEMPTS).map((u) => u.id);
  if (resend.length) await knex('uploads').whereIn('id', resend).update({ enqueued_at: now });
  await enqueueParse(resend);
  return { resent: resend.length, failed: exhausted.length };
}

/**
 * Deletes objects under `prefix` older than ORPHAN_AFTER_MS that no upload
 * names: what a request killed between storing a file and recording it, or a
 * delete that failed, left behind. Returns the deleted keys.
 */
export async function sweepOrphanObjects(knex: Db, { now = new Date(), prefix = 'rides/' } = {}): Promise<string[]> {
  const deleted: string[] = [];
  let token: string | undefined;
  do {
    const page = await listObjects(prefix, token);
    token = page.next;
    const old = page.objects.filter((o) => o.lastModified.getTime() < now.getTime() - ORPHAN_AFTER_MS).map((o) => o.key);
    if (!old.length) continue;
    const named = new Set((await knex('uploads').whereIn('storage_key', old).distinct('storage_key')).map((r: { storage_key: string }) => r.storage_key));
    const orphans = old.filter((k) => !named.has(k));
    await deleteObjects(orphans);
    deleted.push(...orphans);
  } while (token);
  return deleted;
}

/**
 * Whether the client has files being read now: queued and sent within
 * RESEND_AFTER_MS. Flag judgement waits for those; a failed or stuck upload
 * does not hold it back (when it is read at last, the flags are judged again).
 */
export async function filesInFlight(knex: Db, clientId: string, now = new Date()): Promise<boolean> {
  const row = await knex('uploads')
    .where({ client_id: clientId, status: 'queued' })
    .where('enqueued_at', '>=', new Date(now.getTime() - RESEND_AFTER_MS))
    .first('id');
  return row !== undefined;
}
