// The one shape every read and write goes through: a table called by name,
// as with Knex, but handed out by the layer with its restriction already in
// the query. Who hands it out decides what it may see (a request's scope, a
// grant on one client or clinic, or a named system accessor); the code that
// uses it cannot widen it. Only this folder and src/lib/db import Knex.
import type { Knex } from 'knex';

/** A composable query of one table (join, aggregate, page it as with Knex). */
export type Query<TRecord extends {} = any, TResult = any[]> = Knex.QueryBuilder<TRecord, TResult>;

/**
 * Tables by name (`db('rides')`, `db('rides as r')`), a transaction that hands
 * out the same restriction, and `fn.now()`. A Knex instance is one too, so
 * tests may pass their own pool to a system function.
 */
export interface Db {
  <TRecord extends {} = any, TResult = TRecord[]>(table: string): Knex.QueryBuilder<TRecord, TResult>;
  transaction<T>(fn: (tx: Db) => Promise<T>): Promise<T>;
  readonly fn: Knex.FunctionHelper;
}

/** What a holder of a Db may do with one table: how reads are narrowed, and whether and how it writes. */
export interface TablePolicy {
  /**
   * Adds the restriction to a query of `table` under `alias` and says whether
   * it added one; throws for a table the holder may not touch.
   */
  restrict(table: string, alias: string, q: Query, conn: Knex): boolean;
  /** 'read': no writes at all; 'write': writes as they are; a function checks (and may fill in) each inserted row, and says whether updates and deletes are allowed. */
  writes(table: string): 'read' | 'write' | { insert: (row: Record<string, unknown>) => Record<string, unknown>; change: boolean };
  /** For refusals: who holds it. */
  readonly holder: string;
}

const CONNECTION = Symbol('kinloop.connection');

type Wrapped = Db & { [CONNECTION]: Knex };

const TABLE = /^\s*([a-z_][a-z0-9_]*)(?:\s+as\s+([a-z_][a-z0-9_]*))?\s*$/i;

export function parseTable(spec: string): { table: string; alias: string } {
  const m = typeof spec === 'string' ? TABLE.exec(spec) : null;
  if (!m) throw new Error(`A table is named as 'table' or 'table as alias', not ${JSON.stringify(spec)}.`);
  return { table: m[1].toLowerCase(), alias: m[2] ?? m[1] };
}

/**
 * Tables a restricted query may join by name: the people and places a visible
 * row refers to (its author, its client, its clinic). Anything else is joined
 * as a restricted query of its own: `.join(db('flags').as('f'), …)`.
 */
export const REFERENCE_TABLES = new Set(['users', 'clients', 'clinics', 'memberships', 'carer_links']);

const WRITES = ['insert', 'update', 'del', 'delete', 'increment', 'decrement', 'truncate', 'upsert'] as const;
const JOINS = ['join', 'innerJoin', 'leftJoin', 'leftOuterJoin', 'rightJoin', 'rightOuterJoin', 'outerJoin', 'fullOuterJoin', 'crossJoin'] as const;

type Methods = Record<string, (...args: unknown[]) => unknown>;

function refuse(holder: string, table: string, what: string): never {
  throw new Error(`${holder} may not ${what} on ${table}: ${what.startsWith('or') || what === 'clearWhere' || what === 'or' ? 'combine alternatives inside .where((q) => …), so they cannot widen the restriction' : what.toLowerCase().includes('join') ? 'join a restricted query (db(…).as(…)) or a reference table' : 'writes go through a grant (scope.client, scope.clinic) or a system accessor'}.`);
}

/** Keeps a write to what the policy allows. */
function guardWrites(q: Query, table: string, policy: TablePolicy): void {
  const writes = policy.writes(table);
  if (writes === 'write') return;
  const target = q as unknown as Methods;
  if (writes === 'read') {
    for (const m of WRITES) target[m] = () => refuse(policy.holder, table, m);
    return;
  }
  const insert = target.insert.bind(q);
  target.insert = (values: unknown, ...rest: unknown[]) =>
    insert(Array.isArray(values) ? values.map((v) => writes.insert(v as Record<string, unknown>)) : writes.insert(values as Record<string, unknown>), ...rest);
  target.upsert = () => refuse(policy.holder, table, 'upsert');
  target.truncate = () => refuse(policy.holder, table, 'truncate');
  if (!writes.change) for (const m of ['update', 'del', 'delete', 'increment', 'decrement'] as const) target[m] = () => refuse(policy.holder, table, m);
}

/**
 * Keeps a restriction in place: a top-level OR would sit beside it rather than
 * under it (`restricted AND a OR b`), a raw condition might hold one, and
 * clearing the conditions would drop it; a join by name could reach a table
 * the holder may not read.
 */
function guardRestriction(q: Query, table: string, policy: TablePolicy): void {
  const target = q as unknown as Methods;
  for (let p: object | null = q; p && p !== Object.prototype; p = Object.getPrototypeOf(p)) {
    for (const name of Object.getOwnPropertyNames(p)) if (name.startsWith('orWhere')) target[name] = () => refuse(policy.holder, table, name);
  }
  Object.defineProperty(q, 'or', { get: () => refuse(policy.holder, table, 'or') });
  target.clearWhere = () => refuse(policy.holder, table, 'clearWhere');
  target.clear = () => refuse(policy.holder, table, 'clear');
  target.joinRaw = () => refuse(policy.holder, table, 'joinRaw');
  // A raw condition is kept in brackets of its own.
  target.whereRaw = (...args: unknown[]) => q.where((g) => void (g as unknown as Methods).whereRaw(...args));
  for (const m of JOINS) {
    const join = target[m].bind(q);
    target[m] = (other: unknown, ...rest: unknown[]) => {
      if (typeof other === 'string' && !REFERENCE_TABLES.has(parseTable(other).table)) refuse(policy.holder, parseTable(other).table, m);
      if (typeof other !== 'string' && !isQuery(other)) refuse(policy.holder, table, m);
      return join(other, ...rest);
    };
  }
}
function isQuery(x: unknown): boolean {
  return typeof x === 'object' && x !== null && typeof (x as { toSQL?: unknown }).toSQL === 'function';
}

function guard(q: Query, table: string, policy: TablePolicy, restricted: boolean): void {
  guardWrites(q, table, policy);
  if (restricted) guardRestriction(q, table, policy);
  // A copy keeps the restriction's conditions; it gets the same guards.
  const clone = (q as unknown as Methods).clone.bind(q);
  (q as unknown as Methods).clone = () => {
    const c = clone() as Query;
    guard(c, table, policy, restricted);
    return c;
  };
}

/** A Db over a connection (or transaction) under a policy. */
export function makeDb(conn: Knex, policy: TablePolicy): Db {
  const db = ((spec: string) => {
    const { table, alias } = parseTable(spec);
    const q = conn(spec);
    const restricted = policy.restrict(table, alias, q, conn);
    guard(q, table, policy, restricted);
    return q;
  }) as Wrapped;
  db.transaction = <T>(fn: (tx: Db) => Promise<T>) => conn.transaction((trx) => fn(makeDb(trx, policy))) as Promise<T>;
  Object.defineProperty(db, 'fn', { get: () => conn.fn });
  db[CONNECTION] = conn;
  return db;
}

/** The connection under a Db the layer made (or the Knex a test passed): for the layer's own SQL only. */
export function connectionOf(db: Db): Knex {
  return (db as Partial<Wrapped>)[CONNECTION] ?? (db as unknown as Knex);
}

/**
 * Holds `key` until the transaction `tx` ends: two transactions that take the
 * same key run one after the other (placing a session, judging flags, saving
 * a prescription version, counting sign-in attempts).
 */
export async function lock(tx: Db, key: string): Promise<void> {
  await connectionOf(tx).raw('SELECT pg_advisory_xact_lock(hashtextextended(?, 0))', [key]);
}
