import { deliverDueEmails } from '../mail/outbox';
import { db } from '../db/knex';

const OUTBOX_POLL_MS = 2000;

let started = false;

/**
 * Starts the background work of this process: the outbox delivery loop (and,
 * as later areas register them, the job queue's workers). Idempotent.
 */
export function startBackgroundWork(): void {
  if (started) return;
  started = true;
  const loop = async () => {
    try {
      await deliverDueEmails(db());
    } catch (err) {
      console.error('outbox delivery failed:', (err as Error).message);
    }
    setTimeout(loop, OUTBOX_POLL_MS).unref();
  };
  void loop();
}
