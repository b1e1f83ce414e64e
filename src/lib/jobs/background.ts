import { db } from '../db/knex';
import { processUpload } from '../ingest/process';
import { resendStaleUploads } from '../ingest/sweep';
import { deliverDueEmails } from '../mail/outbox';
import { registerFlagJobs } from '../supervision/flag-jobs';
import { sendScheduledEmails } from '../notifications/scheduled';
import { QUEUES, queue, workQueue } from './queue';

const OUTBOX_POLL_MS = 2000;
// Crash-recovery tests hold a job here to kill the worker while it is active.
const PARSE_HOLD_MS = Number(process.env.KINLOOP_PARSE_HOLD_MS ?? 0);
const SWEEP_MS = 60_000;

let started: Promise<void> | null = null;

function every(ms: number, name: string, task: () => Promise<unknown>): void {
  const loop = async () => {
    try {
      await task();
    } catch (err) {
      console.error(`${name} failed:`, (err as Error).message);
    }
    setTimeout(loop, ms).unref();
  };
  void loop();
}

/**
 * Starts this process's background work: the job queue's workers, the outbox
 * delivery loop and the sweeper for uploads whose job message was lost.
 * Runs inside the app server by default, or alone through `npm run worker`.
 */
export function startBackgroundWork(): Promise<void> {
  started ??= (async () => {
    await workQueue<{ uploadId: string }>(QUEUES.parseRide, async ({ uploadId }) => {
      if (PARSE_HOLD_MS) await new Promise((r) => setTimeout(r, PARSE_HOLD_MS));
      await processUpload(db(), uploadId);
    });
    await registerFlagJobs();
    await (await queue()).schedule(QUEUES.scheduledMail, '0 * * * *');
    await workQueue(QUEUES.scheduledMail, async () => {
      await sendScheduledEmails(db());
    });
    every(OUTBOX_POLL_MS, 'outbox delivery', () => deliverDueEmails(db()));
    every(SWEEP_MS, 'upload sweep', () => resendStaleUploads(db()));
  })();
  started.catch((err) => console.error('background work did not start:', err));
  return started;
}
