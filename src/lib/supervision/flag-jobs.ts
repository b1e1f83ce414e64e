import { config } from '../config';
import { db } from '../db/knex';
import { onRidesChanged } from '../ingest/ride-events';
import { filesInFlight } from '../ingest/sweep';
import { QUEUES, queue, sendJob, workQueue } from '../jobs/queue';
import { refreshAdherence } from './adherence-store';
import { evaluateClientFlags } from './flag-store';
import { clientsWithNewDay } from './new-day';


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
export async function refreshStoredWeeks(clientId: string): Promise<void> {
  try {
    await refreshAdherence(db(), clientId);
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
    if (await filesInFlight(db(), clientId)) return scheduleFlagEvaluation(clientId);
    await evaluateClientFlags(db(), clientId);
    await refreshStoredWeeks(clientId);
  });

  // Every hour, the clients for whom it has just turned midnight: a finished
  // day (no session for too long) and, on Mondays, a finished week.
  await (await queue()).schedule(QUEUES.sweepFlags, '5 * * * *');
  await workQueue(QUEUES.sweepFlags, async () => {
    const clients = await db()('clients').whereNull('archived_at').select('id', 'time_zone');
    for (const c of clientsWithNewDay(clients, new Date())) await scheduleFlagEvaluation(c.id, 0);
  });
}
