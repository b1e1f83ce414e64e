import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { Http } from '../support/http';
import { waitForMail } from '../support/mail';
import { createWorld, freshSession, leaks, ROLES, type World } from '../support/world';
import { MATRIX } from './authz/matrix';
import { discoverApiRoutes } from './authz/routes';

describe('authorization matrix', () => {
  let world: World;
  beforeAll(async () => {
    world = await createWorld('authz');
    // Mail for both clinics' people in the dev mailbox, so that its answers have something to leak:
    // reset links of each clinic's admin and an invitation of each clinic.
    const inviteeA = `invitee-a.${world.tag}@example.test`;
    const inviteeB = `invitee-b.${world.tag}@example.test`;
    world.secrets.push({ text: inviteeA, what: 'clinic A invitation', seenBy: ['therapist', 'admin'] }, { text: inviteeB, what: 'clinic B invitation', seenBy: ['otherTherapist', 'otherAdmin'] });
    await new Http().post('/api/auth/reset-request', { email: world.users.admin.email });
    await new Http().post('/api/auth/reset-request', { email: world.users.otherAdmin.email });
    expect((await (await world.as('admin')).post('/api/invitations', { email: inviteeA, role: 'therapist' })).status).toBe(201);
    expect((await (await world.as('otherAdmin')).post('/api/invitations', { email: inviteeB, role: 'therapist' })).status).toBe(201);
    await Promise.all([world.users.admin.email, world.users.otherAdmin.email, inviteeA, inviteeB].map((to) => waitForMail(to)));
  });
  afterAll(closeDb);

  it('has an entry for every API route and method, and no entry for a route that does not exist', () => {
    const routes = discoverApiRoutes();
    expect(routes.length).toBeGreaterThan(10);
    expect(routes.filter((r) => !(r in MATRIX))).toEqual([]);
    expect(Object.keys(MATRIX).filter((k) => !routes.includes(k))).toEqual([]);
  });

  for (const [key, entry] of Object.entries(MATRIX)) {
    const [method] = key.split(' ');
    it(`${key}`, async () => {
      const actual: Record<string, number> = {};
      const leaked: Record<string, string[]> = {};
      for (const role of ROLES) {
        const http = entry.freshSession ? await freshSession(world, role) : await world.as(role);
        const { path, body } = await entry.request(world, role);
        const res = await http.request(method, path, method === 'GET' || method === 'DELETE' ? body : (body ?? {}));
        actual[role] = res.status;
        const text = await res.text();
        const found = leaks(world, role, text);
        if (found.length) leaked[role] = found;
        // Every refusal is JSON with a code and a message the user can act on.
        if (res.status >= 400) {
          const err = JSON.parse(text).error;
          expect(err.code, `${key} as ${role}`).toEqual(expect.any(String));
          expect(err.message, `${key} as ${role}`).toEqual(expect.any(String));
        }
      }
      expect(actual).toEqual(entry.expect);
      // No answer, whatever its status, holds a record the caller may not see.
      expect(leaked).toEqual({});
    });
  }
});
