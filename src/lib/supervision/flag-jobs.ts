import { config } from '../config';
import { workerDb } from '../data';
import { onRidesChanged } from '../ingest/ride-events';
import { filesInFlight } from '../ingest/sweep';
import { QUEUES, queue, sendJob, workQueue } from '../jobs/queue';
import { refreshAdherence, refreshAdherenceIfNeeded } from './adherence-store';
import { evaluateClientFlags } from './flag-store';
import { clientsWithNewDay } from './new-day';
import { refreshProgression } from '../care/progression-service';


const SWEEP_PAGE = 500;

// Files arrive in batches (a fortnight at once, in any order). Evaluating a
// little after the last one, and never while the client still has files
// waiting to be parsed, means a batch is judged once, as a whole.
export async function scheduleFlagEvaluation(clientId: string, delayS = config().flagDelayS): Promise<void> {
  await sendJob(QUEUES.evaluateFlags, { clientId }, { singletonKey: clientId, ...(delayS ? { startAfter: delayS } : {}) });
}

/**
 * Stores the client's weeks again. A failure only leaves them stale, which
 * readers notice and answer from the whole history; the minute sweep tries again.
 */
export async function refreshStoredWeeks(clientId: string, { always = true }: { always?: boolean } = {}): Promise<void> {
  try {
    if (always) await refreshAdherence(workerDb(), clientId);
    else await refreshAdherenceIfNeeded(workerDb(), clientId);
  } catch (err) {
    console.error(`storing the weeks of client ${clientId} failed:`, (err as Error).message);
  }
}

export async function registerFlagJobs(): Promise<void> {
  onRidesChanged(async (_knex, clientId) => {
    await refreshStoredWeeks(clientId);
    await scheduleFlagEvaluation(clientId);
  });

  // Also after a change of prescription, pause or threshold, and at the
  // client's midnight, so the stored weeks reach the current one.
  await workQueue<{ clientId: string }>(QUEUES.evaluateFlags, async ({ clientId }) => {
    if (await filesInFlight(workerDb(), clientId)) return scheduleFlagEvaluation(clientId);
    await evaluateClientFlags(workerDb(), clientId);
    await refreshStoredWeeks(clientId, { always: false });
    // Progression is judged on the same occasions, after the flags (an open urgent flag holds it back).
    await refreshProgression(workerDb(), clientId);
  });

  // Every hour, the clients for whom it has just turned midnight: a finished
  // day (no session for too long) and, on Mondays, a finished week.
  await (await queue()).schedule(QUEUES.sweepFlags, '5 * * * *');
  await workQueue(QUEUES.sweepFlags, async () => {
    const now = new Date();
    // A page of clients at a time: the sweep's memory does not grow with the installation.
    let after = '00000000-0000-0000-0000-000000000000';
    for (;;) {
      const clients: { id: string; time_zone: string }[] = await workerDb()('clients').whereNull('archived_at').where('id', '>', after).orderBy('id').limit(SWEEP_PAGE).select('id', 'time_zone');
      if (!clients.length) break;
      after = clients[clients.length - 1].id;
      for (const c of clientsWithNewDay(clients, now)) await scheduleFlagEvaluation(c.id, 0);
    }
  });
}
