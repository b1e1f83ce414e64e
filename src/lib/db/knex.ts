import knexFactory, { type Knex } from 'knex';
import pg from 'pg';
import { config } from '../config';

// DATE columns hold local calendar dates (a client's program start, a pause's
// days); read them as 'YYYY-MM-DD', never as a Date at the server's midnight.
const DATE_OID = 1082;
pg.types.setTypeParser(DATE_OID, (value: string) => value);

let instance: Knex | null = null;

/** The process-wide connection pool. */
export function db(): Knex {
  if (!instance) {
    instance = knexFactory({
      client: 'pg',
      connection: config().databaseUrl,
      pool: { min: 0, max: config().dbPool },
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
