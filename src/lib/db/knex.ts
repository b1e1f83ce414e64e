import knexFactory, { type Knex } from 'knex';
import pg from 'pg';
import { config } from '../config';

// DATE columns hold local calendar dates (a client's program start, a pause's
// days); read them as 'YYYY-MM-DD', never as a Date at the server's midnight.
const DATE_OID = 1082;
pg.types.setTypeParser(DATE_OID, (value: string) => value);

let instance: Knex | null = null;

/** A connection pool of its own, for a URL other than the app's (the owner's, for migrations). */
export function connect(url: string, poolMax = 2): Knex {
  return knexFactory({ client: 'pg', connection: url, pool: { min: 0, max: poolMax } });
}

/** The process-wide connection pool, as the app's role. */
export function db(): Knex {
  instance ??= connect(config().databaseUrl, config().dbPool);
  return instance;
}

export async function closeDb(): Promise<void> {
  if (instance) {
    const current = instance;
    instance = null;
    await current.destroy();
  }
}
