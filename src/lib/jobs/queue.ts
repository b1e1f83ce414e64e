import PgBoss from 'pg-boss';
import { config } from '../config';

// Kinloop's PostgreSQL-backed job queue. A job survives a crash or restart: it
// stays in the database until a worker completes it.
export const QUEUES = {
  parseRide: 'ride-parse',
  evaluateFlags: 'flags-evaluate',
  sweepFlags: 'flags-sweep',
  scheduledMail: 'mail-scheduled',
} as const;

const QUEUE_OPTIONS: Record<string, Omit<PgBoss.Queue, 'name'>> = {
  [QUEUES.parseRide]: { retryLimit: 6, retryDelay: 5, retryBackoff: true, expireInSeconds: 300 },
  // "stately": at most one waiting and one running evaluation per client.
  [QUEUES.evaluateFlags]: { policy: 'stately', retryLimit: 5, retryDelay: 10, retryBackoff: true },
  [QUEUES.sweepFlags]: { policy: 'short', retryLimit: 2 },
  [QUEUES.scheduledMail]: { policy: 'short', retryLimit: 2 },
};

let boss: Promise<PgBoss> | null = null;

/** The started queue client of this process (one per process, created on first use). */
export function queue(): Promise<PgBoss> {
  boss ??= (async () => {
    const instance = new PgBoss({
      connectionString: config().databaseUrl,
      schema: config().queueSchema,
      max: 4,
      // Active jobs of a worker that died are found and retried this often.
      maintenanceIntervalSeconds: config().queueMaintenanceS,
    });
    instance.on('error', (err) => console.error('job queue:', err.message));
    await instance.start();
    for (const [name, options] of Object.entries(QUEUE_OPTIONS)) await ensureQueue(instance, name, options);
    return instance;
  })();
  // A queue that could not start (the database was away) is tried again on next use.
  const starting = boss;
  starting.catch(() => {
    if (boss === starting) boss = null;
  });
  return boss;
}

/**
 * Creates a queue unless it exists. Two processes starting together on a new
 * database can deadlock in pg-boss's createQueue; one of them retries.
 */
async function ensureQueue(instance: PgBoss, name: string, options: Omit<PgBoss.Queue, 'name'>): Promise<void> {
  for (let attempt = 1; ; attempt++) {
    try {
      if (!(await instance.getQueue(name))) await instance.createQueue(name, { name, ...options });
      return;
    } catch (err) {
      const code = (err as { code?: string }).code;
      if (attempt >= 5 || (code !== '40P01' && code !== '23505')) throw err;
      await new Promise((r) => setTimeout(r, 100 * attempt + Math.random() * 200));
    }
  }
}

export async function stopQueue(): Promise<void> {
  if (!boss) return;
  const b = await boss;
  boss = null;
  await b.stop({ graceful: true, wait: true, timeout: 10_000 });
}

const localWorkers = new Map<string, string[]>();

/** Where a job is in its retries: the last attempt may settle for good what it could not do. */
export interface Attempt {
  retryCount: number;
  retryLimit: number;
  /** No retry follows this attempt. */
  last: boolean;
}

/**
 * Works a queue in this process, one job at a time. pg-boss waits a polling
 * interval after every fetch; waking the worker after each job (and when this
 * process sends one) keeps a batch of files flowing without that pause.
 */
export async function workQueue<T extends object>(name: string, handler: (data: T, attempt: Attempt) => Promise<void>): Promise<void> {
  const boss = await queue();
  let id = '';
  id = await boss.work<T>(name, { batchSize: 1, pollingIntervalSeconds: 1, includeMetadata: true }, async ([job]) => {
    try {
      await handler(job.data, { retryCount: job.retryCount, retryLimit: job.retryLimit, last: job.retryCount >= job.retryLimit });
    } finally {
      boss.notifyWorker(id);
    }
  });
  localWorkers.set(name, [...(localWorkers.get(name) ?? []), id]);
}

export async function sendJob(name: string, data: object, options: PgBoss.SendOptions = {}): Promise<string | null> {
  const boss = await queue();
  const id = await boss.send(name, data, options);
  if (!options.startAfter) for (const worker of localWorkers.get(name) ?? []) boss.notifyWorker(worker);
  return id;
}
