import { lock, type Db } from '../data/db';
import type { UploadRow } from '../db/tables';
import { QUEUES, sendJob } from '../jobs/queue';
import type { StoredFile } from './receive';

export interface NewUpload extends StoredFile {
  fallbackStartedAt: Date | null;
}

/**
 * Records stored files as uploads in one transaction. The same bytes for the
 * same client are recognised by SHA-256: they share the first copy's stored
 * object (the caller deletes the object it stored for nothing) and take that
 * copy's outcome instead of being parsed twice — at once when it is known,
 * else when the first copy has been read (`settleFollowers`). The others are
 * queued for parsing.
 */
export async function registerUploads(
  db: Db,
  p: { clientId: string; clinicId: string; userId: string; importProfileId: string | null; files: NewUpload[] },
): Promise<UploadRow[]> {
  const rows = await db.transaction(async (trx) => {
    // Two uploads of the same bytes at once must not both be parsed.
    await lock(trx, `uploads:${p.clientId}`);
    const out: UploadRow[] = [];
    for (const f of p.files) {
      const originals = await trx<UploadRow>('uploads')
        .where({ client_id: p.clientId, sha256: f.sha256 })
        .whereNull('duplicate_of_upload_id')
        .orderBy('uploaded_at');
      // A file already read gives its outcome. A refused file sent again with
      // another import profile is read again (that is how a carer fixes it),
      // and a copy waits only for a first copy read with the same profile. A
      // failed read gives nothing: sending the file again tries again.
      const sameProfile = (o: UploadRow) => o.import_profile_id === p.importProfileId;
      const earlier =
        originals.find((o) => o.status === 'accepted' || o.status === 'duplicate') ??
        originals.find((o) => o.status === 'queued' && sameProfile(o)) ??
        originals.find((o) => o.status === 'rejected' && sameProfile(o));
      const first = originals[0];
      const base = {
        client_id: p.clientId,
        clinic_id: p.clinicId,
        uploaded_by: p.userId,
        original_name: f.name,
        byte_size: f.byteSize,
        sha256: f.sha256,
        storage_key: first?.storage_key ?? f.storageKey,
        import_profile_id: p.importProfileId,
        fallback_started_at: f.fallbackStartedAt,
      };
      const [row]: UploadRow[] = await trx('uploads')
        .insert(
          !earlier
            ? { ...base, status: 'queued', enqueued_at: trx.fn.now() }
            : earlier.status === 'queued'
              ? { ...base, status: 'queued', enqueued_at: trx.fn.now(), duplicate_of_upload_id: earlier.id }
              : { ...base, ...outcomeOf(earlier), duplicate_of_upload_id: earlier.id, processed_at: trx.fn.now() },
        )
        .returning('*');
      out.push(row);
    }
    return out;
  });
  // The rows are committed: a job that cannot be sent now is sent by the sweeper later.
  await enqueueParse(rows.filter((r) => r.status === 'queued' && !r.duplicate_of_upload_id).map((r) => r.id)).catch((err) =>
    console.error('parse jobs not sent; the sweeper sends them again:', (err as Error).message),
  );
  return rows;
}

/** What a copy of `original` records: a duplicate of its session, or the same refusal or failure. */
function outcomeOf(original: UploadRow) {
  if (original.status === 'rejected' || original.status === 'failed') {
    return { status: original.status, error: JSON.stringify(original.error), duplicate_of_ride_id: null };
  }
  return { status: 'duplicate', error: null, duplicate_of_ride_id: original.ride_id ?? original.duplicate_of_ride_id };
}

/**
 * Gives every copy of `original` (the same bytes sent again) the outcome
 * `original` has now: called in the transaction that settled it, so a copy
 * that waited for it is never left queued and a copy of a file whose session
 * was later replaced or refused follows it.
 */
export async function settleFollowers(trx: Db, originalId: string): Promise<void> {
  const original = await trx<UploadRow>('uploads').where({ id: originalId }).first();
  if (!original || original.status === 'queued') return;
  await trx('uploads')
    .where({ duplicate_of_upload_id: originalId })
    .update({ ...outcomeOf(original), processed_at: trx.fn.now() });
}

/**
 * Asks the worker to parse uploads. Losing this message (a crash right after
 * the commit) loses nothing: the sweeper re-sends uploads left queued.
 */
export async function enqueueParse(uploadIds: string[]): Promise<void> {
  if (!uploadIds.length) return;
  for (const uploadId of uploadIds) await sendJob(QUEUES.parseRide, { uploadId });
}
