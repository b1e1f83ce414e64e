import PgBoss from 'pg-boss';
import { config } from '../config';

// Kinloop's PostgreSQL-backed job queue. A job survives a crash or restart: it
// stays in the database until a worker completes it.
export const QUEUES = {
  parseRide: 'ride-parse',
} as const;

const QUEUE_OPTIONS: Record<string, Omit<PgBoss.Queue, 'name'>> = {
  [QUEUES.parseRide]: { retryLimit: 6, retryDelay: 5, retryBackoff: true, expireInSeconds: 300 },
};

let boss: Promise<PgBoss> | null = null;

/** The started queue client of this process (one per process, created on first use). */
export function queue(): Promise<PgBoss> {
  boss ??= (async () => {
    const instance = new PgBoss({
      connectionString: config().databaseUrl,
      schema: process.env.KINLOOP_QUEUE_SCHEMA ?? 'pgboss',
      max: 4,
      // Active jobs of a worker that died are found and retried this often.
      maintenanceIntervalSeconds: Number(process.env.KINLOOP_QUEUE_MAINTENANCE_S ?? 30),
    });
    instance.on('error', (err) => console.error('job queue:', err.message));
    await instance.start();
    for (const [name, options] of Object.entries(QUEUE_OPTIONS)) {
      await instance.createQueue(name, { name, ...options });
    }
    return instance;
  })();
  return boss;
}

export async function stopQueue(): Promise<void> {
  if (!boss) return;
  const b = await boss;
  boss = null;
  await b.stop({ graceful: true, wait: true, timeout: 10_000 });
}
