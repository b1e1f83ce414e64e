// The data layer's restrictions as SQL, compiled without a database: what a
// request's queries say, and what they refuse to do. The expected conditions
// are PRODUCT.md's access rules written out by hand.
import knexFactory from 'knex';
import { describe, expect, it } from 'vitest';
import type { Viewer } from '../../../src/lib/auth/viewer';
import { Scope } from '../../../src/lib/data/scope';
import type { ClientRow } from '../../../src/lib/db/tables';

const knex = knexFactory({ client: 'pg' });
const base: Viewer = { userId: 'u-1', email: 'u@x.test', name: 'U', sessionId: 's', memberships: [], carerOf: [], clientId: null };
const as = (v: Partial<Viewer>) => new Scope({ viewer: { ...base, ...v }, ip: '127.0.0.1', userAgent: null }, knex);
const sql = (q: { toSQL(): { sql: string; bindings: readonly unknown[] } }) => q.toSQL();

const therapist = { memberships: [{ clinicId: 'k-1', role: 'therapist' as const }] };
const carer = { carerOf: ['c-1'] };

describe('a request scope', () => {
  it('restricts a client list to the staff’s clinics and to linked clients, never archived ones', () => {
    const staff = sql(as(therapist).clients().orderBy('display_name'));
    expect(staff.sql).toBe('select * from "clients" where ("clients"."archived_at" is null and ("clients"."clinic_id" in (?))) order by "display_name" asc');
    expect(staff.bindings).toEqual(['k-1']);
    const linked = sql(as(carer).clients('c'));
    expect(linked.sql).toBe('select * from "clients" as "c" where ("c"."archived_at" is null and ("c"."clinic_id" in (?) or "c"."id" in (?)))');
    // A carer works in no clinic: the clinic list is an id no row has.
    expect(linked.bindings).toEqual(['00000000-0000-0000-0000-000000000000', 'c-1']);
  });

  it('restricts a client’s records to readable clients, and the clinic’s own records to its staff', () => {
    const rides = sql(as(carer).sessions('r').where('r.client_id', 'c-1'));
    expect(rides.sql).toMatch(/^select \* from "rides" as "r" where \("r"\."client_id" in \(select "rc"\."id" from "clients" as "rc" where "rc"\."archived_at" is null and \("rc"\."clinic_id" in \(\?\) or "rc"\."id" in \(\?\)\)\)\) and "r"\."client_id" = \?$/);
    const notes = sql(as(carer).notes());
    // Notes are the clinic's: a carer's clinic list is empty, so nothing matches.
    expect(notes.sql).toContain('"client_notes"."client_id" in (select "mc"."id" from "clients" as "mc" where "mc"."archived_at" is null and "mc"."clinic_id" in (?))');
    expect(notes.bindings).toEqual(['00000000-0000-0000-0000-000000000000']);
  });

  it('refuses tables without a read rule, and writes outside a grant', () => {
    const s = as(therapist);
    expect(() => s.db('password_resets')).toThrow(/no read rule/);
    expect(() => s.notes().insert({ client_id: 'c-1', body: 'x' })).toThrow(/writes go through a grant/);
    expect(() => s.flags().where({ id: 'f' }).update({ state: 'resolved' })).toThrow(/writes go through a grant/);
    expect(() => s.sessions().del()).toThrow(/writes go through a grant/);
  });

  it('keeps its restriction: no top-level OR, no cleared conditions, no join to a private table by name', () => {
    const s = as(carer);
    expect(() => s.sessions().where('id', 'a').orWhere('id', 'b')).toThrow(/combine alternatives/);
    expect(() => s.sessions().clearWhere()).toThrow(/combine alternatives/);
    expect(() => s.sessions('r').join('client_notes as n', 'n.client_id', 'r.client_id')).toThrow(/join a restricted query/);
    // Alternatives in brackets stay under the restriction; a reference table may be joined.
    const ok = sql(s.checks('c').join('users as u', 'u.id', 'c.recorded_by').where((w) => w.where('c.effort', 1).orWhere('c.effort', 2)));
    expect(ok.sql).toMatch(/^select \* from "checks" as "c" inner join "users" as "u" on "u"\."id" = "c"\."recorded_by" where \("c"\."client_id" in \(.*\)\) and \("c"\."effort" = \? or "c"\."effort" = \?\)$/);
    // A raw condition keeps brackets of its own.
    expect(sql(s.sessions().whereRaw('1 = 1 or 2 = 2')).sql).toMatch(/\) and \(1 = 1 or 2 = 2\)$/);
    // A copy keeps the guards.
    expect(() => s.sessions().clone().orWhere('id', 'b')).toThrow(/combine alternatives/);
  });
});

describe('a grant', () => {
  const row = { id: 'c-1', clinic_id: 'k-1' } as ClientRow;
  // Constructed as scope.client() does after its access check.
  const grant = async (v: Partial<Viewer>, need: 'read' | 'contribute' | 'manage') => {
    const s = as(v);
    const { ClientGrant } = await import('../../../src/lib/data/scope');
    return new ClientGrant(s, knex, row, need);
  };

  it('stamps its client (and clinic) on what it adds, and refuses a row of another client', async () => {
    const g = await grant(carer, 'contribute');
    const q = sql(g.db('checks').insert({ recorded_by: 'u-1', comment: 'ok' }));
    expect(q.sql).toBe('insert into "checks" ("client_id", "clinic_id", "comment", "recorded_by") values (?, ?, ?, ?)');
    expect(q.bindings).toEqual(['c-1', 'k-1', 'ok', 'u-1']);
    expect(() => g.db('checks').insert({ client_id: 'c-2', comment: 'x' })).toThrow(/another client/);
  });

  it('writes only what its need allows', async () => {
    const read = await grant(carer, 'read');
    expect(() => read.db('checks').insert({ comment: 'x' })).toThrow(/writes go through a grant/);
    const contribute = await grant(carer, 'contribute');
    expect(() => contribute.db('client_notes').insert({ body: 'x' })).toThrow(/writes go through a grant/);
    const manage = await grant(therapist, 'manage');
    const update = sql(manage.db('pauses').where({ id: 'p-1' }).update({ reason: 'x' }));
    expect(update.sql).toMatch(/^update "pauses" set "reason" = \? where \("pauses"\."client_id" in \(.*\)\) and "pauses"\."client_id" = \? and "id" = \?$/);
  });
});
