import path from 'node:path';
import type { Knex } from 'knex';

export const migrationsDir = path.resolve(process.cwd(), 'migrations');

export async function migrateLatest(knex: Knex): Promise<string[]> {
  const [, applied] = await knex.migrate.latest({ directory: migrationsDir, loadExtensions: ['.ts'] });
  return applied as string[];
}
