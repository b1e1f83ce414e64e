// The terminal `failed` state: a file Kinloop could not read after every try
// (not a file the parser refused, which is `rejected`). The uploader and the
// clinic see why and can try again.
import type { Db, Query } from '../data/db';
import type { UploadRow } from '../db/tables';
import { settleFollowers } from './register';

const TRY_AGAIN = 'Choose “Try again” to read it once more; if it fails again, tell the clinic.';

/** What the uploader reads about the last error of a read that will not be retried. */
export function failureMessage(err: unknown): string {
  const e = err as { name?: string; code?: string; message?: string; $metadata?: unknown };
  if (e?.name === 'ReadStopped') return `Kinloop could not finish reading this file: ${e.message}.`;
  if (e?.$metadata !== undefined || e?.name === 'NoSuchKey') return 'The stored file could not be fetched from the file store.';
  if (typeof e?.code === 'string' && /^(ECONN|57P|08)/.test(e.code)) return 'The database was not reachable while the file was read.';
  return `An unexpected error stopped Kinloop from reading this file (${String(e?.message ?? err).slice(0, 200)}).`;
}

/** Marks a queued upload failed with the reason, and its waiting copies with it. */
export async function markUploadFailed(knex: Db, uploadId: string, reason: string): Promise<boolean> {
  return knex.transaction(async (trx) => {
    const row = await trx<UploadRow>('uploads').where({ id: uploadId }).forUpdate().first('status');
    if (row?.status !== 'queued') return false;
    await trx('uploads')
      .where({ id: uploadId })
      .update({ status: 'failed', error: JSON.stringify({ code: 'read_failed', message: `${reason} ${TRY_AGAIN}` }), processed_at: trx.fn.now() });
    await settleFollowers(trx, uploadId);
    return true;
  });
}
