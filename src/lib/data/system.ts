// Code that runs with no viewer to scope it — the worker's jobs, sign-in and
// the other steps before a viewer exists, the demo seed and the maintenance
// scripts — gets one of these named accessors instead of the pool. Each says
// who holds it; the import test (tests/unit/architecture/data-access.test.ts)
// lists which files may use which, so a page or service that reaches for one
// fails the suite. See DEVELOPERS.md, "Data access".
import type { Knex } from 'knex';
import { closeDb, db as pool } from '../db/knex';
import { makeDb, type Db, type TablePolicy } from './db';

/** Every table, unrestricted, every write: for work done on no one's behalf. */
export function systemPolicy(holder: string): TablePolicy {
  return { holder, restrict: () => false, writes: () => 'write' };
}

/** The worker's jobs: parsing ride files, judging flags, scheduled and urgent mail, sweeps. They act for every clinic. */
export function workerDb(): Db {
  return makeDb(pool(), systemPolicy('The worker'));
}

/**
 * The tables that sign-in and what comes before a viewer need: accounts,
 * sessions, reset links, sign-in attempts, invitations (preview and accept),
 * the roles an account holds, notification settings (unsubscribe links), and
 * the audit log and outbox they write to. No ride, check, note or flag.
 */
const AUTH_TABLES = new Set([
  'users',
  'auth_sessions',
  'password_resets',
  'sign_in_attempts',
  'invitations',
  'memberships',
  'carer_links',
  'clients',
  'clinics',
  'notification_preferences',
  'audit_log',
  'outbox_emails',
]);

/** Sign-in, sessions, reset links, invitations before they are accepted, unsubscribe links: before a viewer exists. */
export function authDb(): Db {
  const holder = 'Sign-in and account access';
  return makeDb(pool(), {
    holder,
    restrict(table) {
      if (!AUTH_TABLES.has(table)) throw new Error(`${holder} may not touch ${table}.`);
      return false;
    },
    writes: () => 'write',
  });
}

/** The demo seed and the maintenance scripts: the whole database as the app's role. */
export function maintenanceDb(): Db {
  return makeDb(pool(), systemPolicy('Maintenance'));
}

/**
 * The pool itself, for maintenance scripts that need more than tables (bulk
 * COPY, batch inserts, ANALYZE, benchmark tables): never for the app.
 */
export function maintenanceKnex(): Knex {
  return pool();
}

/** Whether PostgreSQL answers (the health check). */
export async function databaseAnswers(): Promise<void> {
  await pool().raw('select 1');
}

/** Closes the pool when a process ends. */
export const closeDatabase = closeDb;
