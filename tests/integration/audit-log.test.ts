// The audit log is append-only for the app's database role, records refused
// requests for client records, and records which clients a list showed.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db } from '../../src/lib/db/knex';
import { createWorld, type World } from '../support/world';

let world: World;
beforeAll(async () => {
  world = await createWorld('audit');
});
afterAll(closeDb);

/** The PostgreSQL error code of a statement, or null when it succeeded. */
async function sqlState(statement: Promise<unknown>): Promise<string | null> {
  try {
    await statement;
    return null;
  } catch (err) {
    return (err as { code?: string }).code ?? 'unknown';
  }
}

describe('the audit log as the app’s database role', () => {
  it('may add and read entries, but not change, delete or empty them', async () => {
    // db() connects as the app does: with DATABASE_URL.
    const app = db();
    const mark = `test.append-only-${randomUUID()}`;
    await app('audit_log').insert({ action: mark, detail: '{}' });
    expect(await app('audit_log').where({ action: mark }).count<{ n: string }[]>('* as n')).toEqual([{ n: '1' }]);
    // source: PostgreSQL's SQLSTATE 42501 is insufficient_privilege
    expect(await sqlState(app.raw('DELETE FROM audit_log WHERE action = ?', [mark]))).toBe('42501');
    expect(await sqlState(app.raw("UPDATE audit_log SET action = 'changed' WHERE action = ?", [mark]))).toBe('42501');
    expect(await sqlState(app.raw('TRUNCATE audit_log'))).toBe('42501');
    expect(await app('audit_log').where({ action: mark }).count<{ n: string }[]>('* as n')).toEqual([{ n: '1' }]);
  });

  it('is owned by another role than the app’s, so the app cannot grant itself more or drop its protection', async () => {
    const app = db();
    const { rows } = await app.raw("SELECT tableowner, current_user AS app FROM pg_tables WHERE schemaname = 'public' AND tablename = 'audit_log'");
    expect(rows[0].tableowner).not.toBe(rows[0].app);
    expect(await sqlState(app.raw('ALTER TABLE audit_log DISABLE TRIGGER ALL'))).toBe('42501');
    expect(await sqlState(app.raw('DROP TABLE audit_log'))).toBe('42501');
  });
});

describe('refused requests for client records', () => {
  it('a therapist of another clinic asking for a client, a session and a flag leaves a trace for each', async () => {
    const other = await world.as('otherTherapist');
    const [flag] = await world.knex('flags')
      .insert({ client_id: world.clientId, clinic_id: world.clinicId, kind: 'skin_concern', severity: 'review', state: 'resolved', anchor: randomUUID(), reason: 'x', evidence: '{}' })
      .returning('id');
    const missing = randomUUID();
    expect((await other.get(`/api/clients/${world.clientId}`)).status).toBe(404);
    expect((await other.get(`/api/clients/${world.clientId}/notes`)).status).toBe(404);
    expect((await other.post(`/api/flags/${flag.id}`, { action: 'acknowledge' })).status).toBe(404);
    expect((await other.get(`/api/sessions/${missing}`)).status).toBe(404);
    const rows = await world.knex('audit_log').where({ actor_user_id: world.users.otherTherapist.id, action: 'access.denied' }).orderBy('id').select('record_type', 'record_id', 'clinic_id', 'client_id', 'detail');
    expect(rows.map((r) => [r.record_type, r.record_id, r.detail.status, r.detail.action])).toEqual([
      ['client', world.clientId, 404, 'client.view'],
      ['client', world.clientId, 404, 'notes.list'],
      ['flag', flag.id, 404, 'flag.act'],
      ['session', missing, 404, 'session.view'],
    ]);
    // Logged without a clinic: clinic A's admins do not learn of clinic B's staff, and the reverse.
    expect(rows.every((r) => r.clinic_id === null && r.client_id === null)).toBe(true);
  });

  it('a carer asking for what only staff may do leaves a trace on the client’s record', async () => {
    const carer = await world.as('carer');
    expect((await carer.get(`/api/clients/${world.clientId}/notes`)).status).toBe(403);
    const row = await world.knex('audit_log').where({ actor_user_id: world.users.carer.id, action: 'access.denied' }).orderBy('id', 'desc').first();
    expect(row).toMatchObject({ clinic_id: world.clinicId, client_id: world.clientId, record_type: 'client', record_id: world.clientId });
    expect(row.detail).toEqual({ status: 403, need: 'manage', action: 'notes.list' });
  });

  it('clinic B’s admin sees that their therapist was refused, not which record; clinic A’s admin does not see it', async () => {
    const other = await world.as('otherTherapist');
    expect((await other.get(`/api/clients/${world.otherClientId}/week`)).status).toBe(404);
    const b = await (await world.as('otherAdmin')).json('GET', '/api/audit?action=access.denied');
    const seen = b.body.entries.filter((e: { actor: { userId: string } | null }) => e.actor?.userId === world.users.otherTherapist.id);
    expect(seen.length).toBeGreaterThan(0);
    expect(JSON.stringify(b.body)).not.toContain(world.otherClientId);
    const a = await (await world.as('admin')).json('GET', '/api/audit?action=access.denied');
    expect(a.body.entries.filter((e: { actor: { userId: string } | null }) => e.actor?.userId === world.users.otherTherapist.id)).toEqual([]);
  });
});

describe('list reads', () => {
  it('caseload, triage and the client list record which clients they showed, and the admin finds them by client', async () => {
    const therapist = await world.as('therapist');
    await world.knex('flags').insert({ client_id: world.otherClientId, clinic_id: world.clinicId, kind: 'bp_drop', severity: 'review', anchor: randomUUID(), reason: 'Listed', evidence: '{}' });
    expect((await therapist.get('/api/caseload')).status).toBe(200);
    expect((await therapist.get('/api/triage')).status).toBe(200);
    expect((await (await world.as('carer')).get('/api/clients')).status).toBe(200);
    const entry = (actor: string, action: string) => world.knex('audit_log').where({ actor_user_id: actor, action }).orderBy('id', 'desc').first();
    const caseload = await entry(world.users.therapist.id, 'caseload.view');
    expect(caseload.clinic_id).toBe(world.clinicId);
    expect([...caseload.detail.clientIds].sort()).toEqual([world.clientId, world.otherClientId].sort());
    const triage = await entry(world.users.therapist.id, 'triage.view');
    expect(triage.detail.clientIds).toEqual([world.otherClientId]);
    const list = await entry(world.users.carer.id, 'clients.list');
    expect(list.detail.clientIds).toEqual([world.clientId]);

    const admin = await world.as('admin');
    const found = await admin.json('GET', `/api/audit?clientId=${world.otherClientId}&action=triage.view`);
    expect(found.body.entries.map((e: { actor: { userId: string } }) => e.actor.userId)).toContain(world.users.therapist.id);
  });
});
