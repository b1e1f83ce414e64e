import knexFactory, { type Knex } from 'knex';
import { config } from '../config';

let instance: Knex | null = null;

/** The process-wide connection pool. */
export function db(): Knex {
  if (!instance) {
    instance = knexFactory({
      client: 'pg',
      connection: config().databaseUrl,
      pool: { min: 0, max: Number(process.env.KINLOOP_DB_POOL ?? 10) },
    });
  }
  return instance;
}

export async function closeDb(): Promise<void> {
  if (instance) {
    const current = instance;
    instance = null;
    await current.destroy();
  }
}
