import { randomUUID } from 'node:crypto';
import type { Role, World } from '../../support/world';

/**
 * The expected status of every API route for every kind of caller. A route
 * added under src/pages/api without an entry here fails the matrix test.
 * `subject` is the client that the client, carer, therapist and admin of the
 * world are all connected to; `otherTherapist` works at another clinic.
 */
export interface MatrixEntry {
  request: (w: World, role: Role) => Promise<{ path: string; body?: unknown }> | { path: string; body?: unknown };
  expect: Record<Role, number>;
  /** The request ends its session (sign-out): use a fresh one per role. */
  freshSession?: boolean;
}

const all = (status: number): Record<Role, number> => ({ anonymous: status, client: status, carer: status, therapist: status, admin: status, otherTherapist: status });
const signedIn = (status: number): Record<Role, number> => ({ ...all(status), anonymous: 401 });
const adminOnly = (ok: number): Record<Role, number> => ({ anonymous: 401, client: 403, carer: 403, therapist: 403, admin: ok, otherTherapist: 403 });

export const MATRIX: Record<string, MatrixEntry> = {
  'GET /api/health': { request: () => ({ path: '/api/health' }), expect: all(200) },
  'POST /api/auth/sign-in': {
    request: () => ({ path: '/api/auth/sign-in', body: { email: `nobody-${randomUUID()}@example.test`, password: 'not-the-password' } }),
    expect: all(401),
  },
  'POST /api/auth/sign-out': { request: () => ({ path: '/api/auth/sign-out' }), expect: signedIn(200), freshSession: true },
  'POST /api/auth/reset-request': { request: () => ({ path: '/api/auth/reset-request', body: { email: `nobody-${randomUUID()}@example.test` } }), expect: all(202) },
  'POST /api/auth/reset': { request: () => ({ path: '/api/auth/reset', body: { token: 'x'.repeat(43), password: 'a-new-password-1' } }), expect: all(410) },
  'POST /api/invitations/accept': { request: () => ({ path: '/api/invitations/accept', body: { token: 'y'.repeat(43), name: 'Someone', password: 'a-new-password-1' } }), expect: all(410) },
  'GET /api/me': { request: () => ({ path: '/api/me' }), expect: signedIn(200) },
  'GET /api/clients': { request: () => ({ path: '/api/clients' }), expect: signedIn(200) },
  'GET /api/clients/[id]': {
    request: (w) => ({ path: `/api/clients/${w.clientId}` }),
    expect: { anonymous: 401, client: 200, carer: 200, therapist: 200, admin: 200, otherTherapist: 404 },
  },
  'GET /api/invitations': {
    request: () => ({ path: '/api/invitations' }),
    expect: { anonymous: 401, client: 403, carer: 403, therapist: 200, admin: 200, otherTherapist: 200 },
  },
  'POST /api/invitations': {
    request: (w) => ({ path: '/api/invitations', body: { email: `carer-${randomUUID().slice(0, 8)}@example.test`, role: 'carer', clientId: w.clientId } }),
    expect: { anonymous: 401, client: 403, carer: 403, therapist: 201, admin: 201, otherTherapist: 404 },
  },
  'POST /api/invitations/[id]/revoke': {
    request: async (w) => {
      const [row] = await w.knex('invitations')
        .insert({ email: `x-${randomUUID()}@example.test`, role: 'carer', clinic_id: w.clinicId, client_id: w.clientId, token_hash: randomUUID(), invited_by: w.users.therapist.id, expires_at: new Date(Date.now() + 86_400_000) })
        .returning('id');
      return { path: `/api/invitations/${row.id}/revoke` };
    },
    expect: { anonymous: 401, client: 404, carer: 404, therapist: 200, admin: 200, otherTherapist: 404 },
  },
  'GET /api/staff': { request: () => ({ path: '/api/staff' }), expect: adminOnly(200) },
  'PATCH /api/staff/[userId]': {
    request: async (w) => ({ path: `/api/staff/${(await w.addStaff('therapist')).id}`, body: { role: 'admin' } }),
    expect: adminOnly(200),
  },
  'GET /api/audit': { request: () => ({ path: '/api/audit' }), expect: adminOnly(200) },
  'GET /api/dev/mailbox': { request: () => ({ path: '/api/dev/mailbox' }), expect: adminOnly(200) },
};
