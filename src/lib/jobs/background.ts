import { config } from '../config';
import { workerDb } from '../data';
import { failureMessage, markUploadFailed } from '../ingest/failures';
import { processUpload } from '../ingest/process';
import { resendStaleUploads, sweepOrphanObjects } from '../ingest/sweep';
import { deliverDueEmails } from '../mail/outbox';
import { refreshStaleAdherence } from '../supervision/adherence-store';
import { registerFlagJobs } from '../supervision/flag-jobs';
import { sendScheduledEmails } from '../notifications/scheduled';
import { ParsePool } from './parse-pool';
import { QUEUES, queue, workQueue } from './queue';

const OUTBOX_POLL_MS = 2000;
const SWEEP_MS = 60_000;
const ORPHAN_SWEEP_MS = 60 * 60_000;
const STALE_WEEKS_PER_SWEEP = 200;

let started: Promise<void> | null = null;
let pool: ParsePool | null = null;

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
 * Starts the worker's background work (`npm run worker`, which `npm start`
 * runs beside the app): the job queue's workers, parsing in parse processes
 * of its own, the outbox delivery loop and the sweepers.
 */
export function startBackgroundWork(): Promise<void> {
  started ??= (async () => {
    pool = new ParsePool(config().parseProcesses);
    const parse = pool;
    await workQueue<{ uploadId: string }>(QUEUES.parseRide, async ({ uploadId }, attempt) => {
      try {
        await processUpload(workerDb(), uploadId, parse.read);
      } catch (err) {
        console.error(`reading upload ${uploadId} failed (attempt ${attempt.retryCount + 1} of ${attempt.retryLimit + 1}):`, (err as Error).message);
        // The last try settles the upload as failed, so it never stays queued for ever.
        if (!attempt.last) throw err;
        await markUploadFailed(workerDb(), uploadId, `${failureMessage(err)} Kinloop tried ${attempt.retryLimit + 1} times.`);
      }
    });
    await registerFlagJobs();
    await (await queue()).schedule(QUEUES.scheduledMail, '0 * * * *');
    await workQueue(QUEUES.scheduledMail, async () => {
      await sendScheduledEmails(workerDb());
    });
    every(OUTBOX_POLL_MS, 'outbox delivery', () => deliverDueEmails(workerDb()));
    every(SWEEP_MS, 'upload sweep', () => resendStaleUploads(workerDb()));
    // Stored weeks left stale (a threshold change, a seed, a refresh that failed), a page at a time.
    every(SWEEP_MS, 'stored weeks', () => refreshStaleAdherence(workerDb(), { maxClients: STALE_WEEKS_PER_SWEEP }));
    every(ORPHAN_SWEEP_MS, 'orphan object sweep', async () => {
      const deleted = await sweepOrphanObjects(workerDb());
      if (deleted.length) console.log(`orphan object sweep deleted ${deleted.length} object(s) no upload names`);
    });
  })();
  started.catch((err) => console.error('background work did not start:', err));
  return started;
}

export function stopBackgroundWork(): void {
  pool?.stop();
}
