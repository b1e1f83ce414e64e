import { config } from '../config';
import { workerDb } from '../data';
import { onRidesChanged } from '../ingest/ride-events';
import { filesInFlight } from '../ingest/sweep';
import { QUEUES, queue, sendJob, workQueue } from '../jobs/queue';
import { evaluateClientFlags } from './flag-store';
import { clientsWithNewDay } from './new-day';
import { refreshProgression } from '../care/progression-service';


// Files arrive in batches (a fortnight at once, in any order). Evaluating a
// little after the last one, and never while the client still has files
// waiting to be parsed, means a batch is judged once, as a whole.
export async function scheduleFlagEvaluation(clientId: string, delayS = config().flagDelayS): Promise<void> {
  await sendJob(QUEUES.evaluateFlags, { clientId }, { singletonKey: clientId, ...(delayS ? { startAfter: delayS } : {}) });
}

export async function registerFlagJobs(): Promise<void> {
  onRidesChanged((_knex, clientId) => scheduleFlagEvaluation(clientId));

  await workQueue<{ clientId: string }>(QUEUES.evaluateFlags, async ({ clientId }) => {
    if (await filesInFlight(workerDb(), clientId)) return scheduleFlagEvaluation(clientId);
    await evaluateClientFlags(workerDb(), clientId);
    // Progression is judged on the same occasions, after the flags (an open urgent flag holds it back).
    await refreshProgression(workerDb(), clientId);
  });

  // Every hour, the clients for whom it has just turned midnight: a finished
  // day (no session for too long) and, on Mondays, a finished week.
  await (await queue()).schedule(QUEUES.sweepFlags, '5 * * * *');
  await workQueue(QUEUES.sweepFlags, async () => {
    const clients = await workerDb()('clients').whereNull('archived_at').select('id', 'time_zone');
    for (const c of clientsWithNewDay(clients, new Date())) await scheduleFlagEvaluation(c.id, 0);
  });
}
