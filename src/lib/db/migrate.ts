import path from 'node:path';
import type { Knex } from 'knex';
import { connect } from './knex';
import { grantAppRole, roleOf } from './roles';

export const migrationsDir = path.resolve(process.cwd(), 'migrations');

export async function migrateLatest(knex: Knex): Promise<string[]> {
  const [, applied] = await knex.migrate.latest({ directory: migrationsDir, loadExtensions: ['.ts'] });
  return applied as string[];
}

/**
 * Runs pending migrations as the owner role (or the app's, without one) and
 * grants the app's role what it may do. `protectedAuditLog` is false when
 * migrations ran as the app's own role, which may then change the audit log.
 */
export async function migrateAsOwner(databaseUrl: string, databaseOwnerUrl: string | null | undefined): Promise<{ applied: string[]; appRole: string; protectedAuditLog: boolean }> {
  const owner = connect(databaseOwnerUrl ?? databaseUrl);
  try {
    const applied = await migrateLatest(owner);
    const appRole = roleOf(databaseUrl);
    const separate = Boolean(databaseOwnerUrl) && roleOf(databaseOwnerUrl!) !== appRole;
    if (separate) await grantAppRole(owner, appRole);
    return { applied, appRole, protectedAuditLog: separate };
  } finally {
    await owner.destroy();
  }
}
