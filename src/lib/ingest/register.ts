import type { Knex } from 'knex';
import type { UploadRow } from '../db/tables';
import { QUEUES, sendJob } from '../jobs/queue';
import type { StoredFile } from './receive';

export interface NewUpload extends StoredFile {
  fallbackStartedAt: Date | null;
}

/**
 * Records stored files as uploads in one transaction. The same bytes for the
 * same client are recognised by SHA-256 and take the earlier file's outcome
 * instead of being parsed twice; the others are queued for parsing.
 */
export async function registerUploads(
  knex: Knex,
  p: { clientId: string; clinicId: string; userId: string; importProfileId: string | null; files: NewUpload[] },
): Promise<UploadRow[]> {
  const rows = await knex.transaction(async (trx) => {
    // Two uploads of the same bytes at once must not both be parsed.
    await trx.raw('SELECT pg_advisory_xact_lock(hashtext(?))', [`uploads:${p.clientId}`]);
    const out: UploadRow[] = [];
    for (const f of p.files) {
      const first = await trx<UploadRow>('uploads')
        .where({ client_id: p.clientId, sha256: f.sha256 })
        .whereNull('duplicate_of_upload_id')
        .orderBy('uploaded_at')
        .first();
      // A refused file sent again with another import profile is read again: that is how a carer fixes it.
      const earlier = first && first.status === 'rejected' && first.import_profile_id !== p.importProfileId ? undefined : first;
      const base = {
        client_id: p.clientId,
        clinic_id: p.clinicId,
        uploaded_by: p.userId,
        original_name: f.name,
        byte_size: f.byteSize,
        sha256: f.sha256,
        storage_key: f.storageKey,
        import_profile_id: p.importProfileId,
        fallback_started_at: f.fallbackStartedAt,
      };
      const [row]: UploadRow[] = await trx('uploads')
        .insert(
          earlier
            ? {
                ...base,
                status: earlier.status === 'rejected' ? 'rejected' : 'duplicate',
                error: earlier.status === 'rejected' ? JSON.stringify(earlier.error) : null,
                duplicate_of_upload_id: earlier.id,
                duplicate_of_ride_id: earlier.ride_id ?? earlier.duplicate_of_ride_id,
                processed_at: trx.fn.now(),
              }
            : { ...base, status: 'queued', enqueued_at: trx.fn.now() },
        )
        .returning('*');
      out.push(row);
    }
    return out;
  });
  await enqueueParse(rows.filter((r) => r.status === 'queued').map((r) => r.id));
  return rows;
}

/**
 * Asks the worker to parse uploads. Losing this message (a crash right after
 * the commit) loses nothing: the sweeper re-sends uploads left queued.
 */
export async function enqueueParse(uploadIds: string[]): Promise<void> {
  if (!uploadIds.length) return;
  for (const uploadId of uploadIds) await sendJob(QUEUES.parseRide, { uploadId });
}
