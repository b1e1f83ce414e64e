// A record of another clinic and a record that does not exist get the same
// answer, so ids cannot be probed for existence.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { createWorld, type World } from '../support/world';

let world: World;
beforeAll(async () => {
  world = await createWorld('oracle');
});
afterAll(closeDb);

describe('another clinic’s record and a missing one answer the same', () => {
  it('sessions, uploads, flags and clients', async () => {
    const therapist = await world.as('therapist');
    const [b] = await world.knex('flags').where({ client_id: world.otherClinicClientId }).select('id');
    const [upload] = await world.knex('uploads').where({ client_id: world.otherClinicClientId }).select('id');
    const pairs: [string, string, string, unknown?][] = [
      ['GET', `/api/sessions/${world.otherClinicSessionId}`, `/api/sessions/${randomUUID()}`],
      ['GET', `/api/uploads/${upload.id}`, `/api/uploads/${randomUUID()}`],
      ['POST', `/api/flags/${b.id}`, `/api/flags/${randomUUID()}`, { action: 'acknowledge' }],
      ['GET', `/api/clients/${world.otherClinicClientId}`, `/api/clients/${randomUUID()}`],
    ];
    for (const [method, theirs, missing, body] of pairs) {
      const a = await therapist.json(method, theirs, body);
      const m = await therapist.json(method, missing, body);
      expect(a.status, theirs).toBe(404);
      expect(a, theirs).toEqual(m);
    }
  });
});
