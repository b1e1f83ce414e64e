import type { Knex } from 'knex';

// Two database roles: the owner runs the migrations and owns every table; the
// app's role (the user of DATABASE_URL) reads and writes the data but may
// only add to the audit log and read it. Run by the owner after each
// migration, so tables a new migration adds are granted too.

/** The user name of a PostgreSQL connection URL. */
export function roleOf(url: string): string {
  return decodeURIComponent(new URL(url).username);
}

const q = (name: string) => `"${name.replace(/"/g, '""')}"`;

export async function grantAppRole(owner: Knex, appRole: string): Promise<void> {
  const role = q(appRole);
  await owner.raw(`GRANT USAGE ON SCHEMA public TO ${role}`);
  await owner.raw(`GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public TO ${role}`);
  await owner.raw(`GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA public TO ${role}`);
  await owner.raw(`REVOKE UPDATE, DELETE, TRUNCATE, REFERENCES, TRIGGER ON audit_log FROM ${role}, PUBLIC`);
  // The migration bookkeeping is the owner's to write; the app (and a pg_dump as the app's role) may read it.
  await owner.raw(`REVOKE INSERT, UPDATE, DELETE, TRUNCATE, REFERENCES, TRIGGER ON knex_migrations, knex_migrations_lock FROM ${role}, PUBLIC`);
}
