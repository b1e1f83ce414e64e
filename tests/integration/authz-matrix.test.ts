import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { createWorld, freshSession, ROLES, type World } from '../support/world';
import { MATRIX } from './authz/matrix';
import { discoverApiRoutes } from './authz/routes';

describe('authorization matrix', () => {
  let world: World;
  beforeAll(async () => {
    world = await createWorld('authz');
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
      for (const role of ROLES) {
        const http = entry.freshSession ? await freshSession(world, role) : await world.as(role);
        const { path, body } = await entry.request(world, role);
        const res = await http.request(method, path, method === 'GET' || method === 'DELETE' ? body : (body ?? {}));
        actual[role] = res.status;
        // Every refusal is JSON with a code and a message the user can act on.
        if (res.status >= 400) {
          const err = (await res.json()).error;
          expect(err.code, `${key} as ${role}`).toEqual(expect.any(String));
          expect(err.message, `${key} as ${role}`).toEqual(expect.any(String));
        } else {
          await res.arrayBuffer();
        }
      }
      expect(actual).toEqual(entry.expect);
    });
  }
});
