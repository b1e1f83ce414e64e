import type { Knex } from 'knex';
import { enqueueParse } from './register';

/** Uploads left queued this long get their parse job sent again (its message may have been lost in a crash). */
export const RESEND_AFTER_MS = 10 * 60_000;

export async function resendStaleUploads(knex: Knex, now = new Date()): Promise<number> {
  const stale = await knex('uploads')
    .where({ status: 'queued' })
    .where('enqueued_at', '<', new Date(now.getTime() - RESEND_AFTER_MS))
    .limit(100)
    .update({ enqueued_at: now })
    .returning('id');
  await enqueueParse(stale.map((r: { id: string }) => r.id));
  return stale.length;
}
