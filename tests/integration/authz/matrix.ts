import { randomUUID } from 'node:crypto';
import { formFor, rideCsv, uploadAndWait } from '../../support/rides';
import { ROLES, type Role, type World } from '../../support/world';

/** One accepted ride of the world's client, uploaded by its carer; made once per run. */
let ride: Promise<{ uploadId: string; sessionId: string }> | null = null;
function carerRide(w: World) {
  ride ??= w.as('carer').then(async (carer) => {
    const [r] = await uploadAndWait(carer, w.clientId, [{ name: 'matrix.csv', content: rideCsv({ startedAt: '2026-03-02T09:00:00Z' }) }]);
    if (r.status !== 'accepted') throw new Error(`matrix ride was ${r.status}`);
    return { uploadId: r.uploadId, sessionId: r.sessionId! };
  });
  return ride;
}

async function profileOf(w: World): Promise<string> {
  const [row] = await w.knex('import_profiles')
    .insert({ clinic_id: w.clinicId, name: `p-${randomUUID().slice(0, 6)}`, mapping: JSON.stringify({ name: 'p', columns: { Zeit: { field: 'time' } } }) })
    .returning('id');
  return row.id;
}
const profileBody = { name: 'Matrix rig', columns: { Zeit: { field: 'time' }, Leistung: { field: 'power', unit: 'W' } } };
const read = (ok: number): Record<Role, number> => ({ anonymous: 401, client: ok, carer: ok, therapist: ok, admin: ok, otherTherapist: 404, otherAdmin: 404 });
const manage = (ok: number): Record<Role, number> => ({ anonymous: 401, client: 403, carer: 403, therapist: ok, admin: ok, otherTherapist: 404, otherAdmin: 404 });
const staff = (ok: number): Record<Role, number> => ({ anonymous: 401, client: 403, carer: 403, therapist: ok, admin: ok, otherTherapist: ok, otherAdmin: ok });
const staffOfClinic = (ok: number): Record<Role, number> => ({ anonymous: 401, client: 404, carer: 404, therapist: 403, admin: ok, otherTherapist: 404, otherAdmin: 404 });

/**
 * The expected status of every API route for every kind of caller. A route
 * added under src/pages/api without an entry here fails the matrix test.
 * `subject` is the client that the client, carer, therapist and admin of the
 * world are all connected to; `otherTherapist` and `otherAdmin` work at
 * another clinic. Whatever the status, the test also reads every answer for
 * the world's secrets the caller may not see (see `Secret` in world.ts).
 */
export interface MatrixEntry {
  request: (w: World, role: Role) => Promise<{ path: string; body?: unknown }> | { path: string; body?: unknown };
  expect: Record<Role, number>;
  /** The request ends its session (sign-out): use a fresh one per role. */
  freshSession?: boolean;
}

const all = (status: number): Record<Role, number> => ({ anonymous: status, client: status, carer: status, therapist: status, admin: status, otherTherapist: status, otherAdmin: status });
const signedIn = (status: number): Record<Role, number> => ({ ...all(status), anonymous: 401 });
/** For an admin of either clinic, in their own clinic. */
const adminOnly = (ok: number): Record<Role, number> => ({ anonymous: 401, client: 403, carer: 403, therapist: 403, admin: ok, otherTherapist: 403, otherAdmin: ok });

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
    expect: read(200),
  },
  'GET /api/invitations': {
    request: () => ({ path: '/api/invitations' }),
    expect: staff(200),
  },
  'POST /api/invitations': {
    request: (w) => ({ path: '/api/invitations', body: { email: `carer-${randomUUID().slice(0, 8)}@example.test`, role: 'carer', clientId: w.clientId } }),
    expect: manage(201),
  },
  'POST /api/invitations/[id]/revoke': {
    request: async (w) => {
      const [row] = await w.knex('invitations')
        .insert({ email: `x-${randomUUID()}@example.test`, role: 'carer', clinic_id: w.clinicId, client_id: w.clientId, token_hash: randomUUID(), invited_by: w.users.therapist.id, expires_at: new Date(Date.now() + 86_400_000) })
        .returning('id');
      return { path: `/api/invitations/${row.id}/revoke` };
    },
    expect: { anonymous: 401, client: 404, carer: 404, therapist: 200, admin: 200, otherTherapist: 404, otherAdmin: 404 },
  },
  'GET /api/staff': { request: () => ({ path: '/api/staff' }), expect: adminOnly(200) },
  'PATCH /api/staff/[userId]': {
    request: async (w) => ({ path: `/api/staff/${(await w.addStaff('therapist')).id}`, body: { role: 'admin' } }),
    // Clinic B's admin changes staff of clinic B only: clinic A's therapist is not found there.
    expect: { ...adminOnly(200), otherAdmin: 404 },
  },
  'GET /api/audit': { request: () => ({ path: '/api/audit' }), expect: adminOnly(200) },
  'GET /api/dev/mailbox': { request: () => ({ path: '/api/dev/mailbox' }), expect: adminOnly(200) },

  'POST /api/uploads': {
    request: (w) => ({ path: '/api/uploads?wait=0', body: formFor(w.clientId, [{ name: 'm.csv', content: rideCsv({ startedAt: new Date(Date.UTC(2025, 0, 1) + Math.random() * 1e10).toISOString() }) }]) }),
    expect: read(202),
  },
  'GET /api/uploads': { request: (w) => ({ path: `/api/uploads?clientId=${w.clientId}` }), expect: read(200) },
  'GET /api/uploads/[id]': { request: async (w) => ({ path: `/api/uploads/${(await carerRide(w)).uploadId}` }), expect: read(200) },
  'GET /api/uploads/[id]/raw': {
    request: async (w) => ({ path: `/api/uploads/${(await carerRide(w)).uploadId}/raw` }),
    expect: { anonymous: 401, client: 403, carer: 200, therapist: 200, admin: 200, otherTherapist: 404, otherAdmin: 404 },
  },
  'POST /api/uploads/[id]/reprocess': {
    request: async (w) => ({ path: `/api/uploads/${(await carerRide(w)).uploadId}/reprocess` }),
    expect: manage(202),
  },
  'GET /api/clients/[id]/sessions': { request: (w) => ({ path: `/api/clients/${w.clientId}/sessions` }), expect: read(200) },
  'GET /api/sessions/[id]': { request: async (w) => ({ path: `/api/sessions/${(await carerRide(w)).sessionId}?points=100` }), expect: read(200) },
  'GET /api/import-profiles': { request: () => ({ path: '/api/import-profiles' }), expect: signedIn(200) },
  'POST /api/import-profiles': { request: () => ({ path: '/api/import-profiles', body: profileBody }), expect: adminOnly(201) },
  'PUT /api/import-profiles/[id]': { request: async (w) => ({ path: `/api/import-profiles/${await profileOf(w)}`, body: profileBody }), expect: staffOfClinic(200) },
  'DELETE /api/import-profiles/[id]': { request: async (w) => ({ path: `/api/import-profiles/${await profileOf(w)}` }), expect: staffOfClinic(200) },
  'POST /api/import-profiles/preview': {
    request: () => ({ path: '/api/import-profiles/preview', body: { sampleBase64: Buffer.from(rideCsv({ minutes: 1 })).toString('base64') } }),
    expect: adminOnly(200),
  },
  'POST /api/clients': {
    request: () => ({ path: '/api/clients', body: { name: `Matrix ${randomUUID().slice(0, 6)}`, timezone: 'Europe/London' } }),
    expect: staff(201),
  },
  'GET /api/clients/[id]/prescription': { request: (w) => ({ path: `/api/clients/${w.clientId}/prescription` }), expect: read(200) },
  'PUT /api/clients/[id]/prescription': {
    // A version that changes nothing is refused (409), so each caller saves a different one.
    request: (w, role) => ({ path: `/api/clients/${w.clientId}/prescription`, body: { sessionsPerWeek: 3, minutesPerSession: 20 + ROLES.indexOf(role), effectiveFrom: '2026-06-01' } }),
    expect: manage(201),
  },
  'GET /api/clients/[id]/pauses': { request: (w) => ({ path: `/api/clients/${w.clientId}/pauses` }), expect: read(200) },
  'POST /api/clients/[id]/pauses': {
    request: (w) => ({ path: `/api/clients/${w.clientId}/pauses`, body: { from: '2030-01-01', to: '2030-01-07', reason: 'Holiday' } }),
    expect: manage(201),
  },
  'POST /api/clients/[id]/pauses/[pauseId]/end': {
    request: async (w) => {
      const [p] = await w.knex('pauses').insert({ client_id: w.clientId, starts_on: '2031-01-01', ends_on: '2031-01-07', reason: 'x', created_by: w.users.therapist.id }).returning('id');
      return { path: `/api/clients/${w.clientId}/pauses/${p.id}/end` };
    },
    expect: manage(200),
  },
  'GET /api/clients/[id]/adherence': { request: (w) => ({ path: `/api/clients/${w.clientId}/adherence?weeks=8` }), expect: read(200) },
  'GET /api/clients/[id]/trends': { request: (w) => ({ path: `/api/clients/${w.clientId}/trends` }), expect: read(200) },
  'GET /api/clients/[id]/notes': { request: (w) => ({ path: `/api/clients/${w.clientId}/notes` }), expect: manage(200) },
  'POST /api/clients/[id]/notes': { request: (w) => ({ path: `/api/clients/${w.clientId}/notes`, body: { body: 'Reviewed the week.' } }), expect: manage(201) },
  'GET /api/clients/[id]/flags': { request: (w) => ({ path: `/api/clients/${w.clientId}/flags` }), expect: manage(200) },
  'POST /api/flags/[id]': {
    request: async (w) => {
      const [f] = await w.knex('flags')
        .insert({ client_id: w.clientId, clinic_id: w.clinicId, kind: 'skin_concern', severity: 'review', anchor: randomUUID(), reason: 'Matrix', evidence: '{}', state: 'resolved' })
        .returning('id');
      // Resolved flags of the same kind may stack; a live one is made per call.
      await w.knex('flags').where({ client_id: w.clientId, kind: 'bp_drop' }).whereIn('state', ['open', 'acknowledged']).update({ state: 'resolved' });
      const [live] = await w.knex('flags').insert({ client_id: w.clientId, clinic_id: w.clinicId, kind: 'bp_drop', severity: 'review', anchor: f.id, reason: 'Matrix', evidence: '{}' }).returning('id');
      return { path: `/api/flags/${live.id}`, body: { action: 'acknowledge', note: 'Seen' } };
    },
    expect: manage(200),
  },
  'GET /api/triage': { request: () => ({ path: '/api/triage' }), expect: staff(200) },
  'GET /api/caseload': { request: () => ({ path: '/api/caseload' }), expect: staff(200) },
  'GET /api/clinic/settings': { request: () => ({ path: '/api/clinic/settings' }), expect: staff(200) },
  'PUT /api/clinic/settings': { request: () => ({ path: '/api/clinic/settings', body: {} }), expect: adminOnly(200) },
  'PATCH /api/clinic/settings': { request: () => ({ path: '/api/clinic/settings', body: { locale: null } }), expect: adminOnly(200) },
  'PATCH /api/clients/[id]': { request: (w) => ({ path: `/api/clients/${w.clientId}`, body: { baselineSystolic: 112 } }), expect: manage(200) },
  'GET /api/clients/[id]/week': { request: (w) => ({ path: `/api/clients/${w.clientId}/week` }), expect: read(200) },
  'GET /api/clients/[id]/progress': { request: (w) => ({ path: `/api/clients/${w.clientId}/progress` }), expect: read(200) },
  'GET /api/clients/[id]/goal': { request: (w) => ({ path: `/api/clients/${w.clientId}/goal` }), expect: read(200) },
  'PUT /api/clients/[id]/goal': { request: (w) => ({ path: `/api/clients/${w.clientId}/goal`, body: { routeId: 'sussex-shore' } }), expect: read(200) },
  'GET /api/routes': { request: () => ({ path: '/api/routes' }), expect: signedIn(200) },
  'GET /api/clients/[id]/checks': { request: (w) => ({ path: `/api/clients/${w.clientId}/checks` }), expect: read(200) },
  'POST /api/clients/[id]/checks': { request: (w) => ({ path: `/api/clients/${w.clientId}/checks`, body: { effort: 5, comment: 'Felt fine' } }), expect: read(201) },
  'GET /api/me/notifications': { request: () => ({ path: '/api/me/notifications' }), expect: signedIn(200) },
  'PUT /api/me/notifications': { request: () => ({ path: '/api/me/notifications', body: { reminders: true, weeklySummary: true, dailyDigest: true, urgentAlerts: true } }), expect: signedIn(200) },
  'GET /api/devices': { request: () => ({ path: '/api/devices' }), expect: staff(200) },
  'POST /api/devices': { request: () => ({ path: '/api/devices', body: { serial: `SN-${randomUUID().slice(0, 8)}` } }), expect: adminOnly(201) },

  // Evidence out: the report PDF, exports, monitoring time, the clinic overview (issue 13).
  'GET /api/clients/[id]/report.pdf': { request: (w) => ({ path: `/api/clients/${w.clientId}/report.pdf?weeks=4` }), expect: manage(200) },
  'POST /api/clients/[id]/report.pdf': { request: (w) => ({ path: `/api/clients/${w.clientId}/report.pdf?weeks=4`, body: { summary: 'Steady month.' } }), expect: manage(200) },
  'GET /api/clients/[id]/sessions.csv': { request: (w) => ({ path: `/api/clients/${w.clientId}/sessions.csv` }), expect: read(200) },
  'GET /api/clients/[id]/fhir': { request: (w) => ({ path: `/api/clients/${w.clientId}/fhir` }), expect: read(200) },
  'GET /api/clients/[id]/monitoring': { request: (w) => ({ path: `/api/clients/${w.clientId}/monitoring` }), expect: manage(200) },
  'POST /api/clients/[id]/monitoring': {
    request: (w) => ({ path: `/api/clients/${w.clientId}/monitoring`, body: { activity: 'review', seconds: 120, source: 'manual' } }),
    expect: manage(201),
  },
  'GET /api/clinic/sessions.csv': { request: () => ({ path: '/api/clinic/sessions.csv' }), expect: adminOnly(200) },
  'GET /api/clinic/overview.csv': { request: () => ({ path: '/api/clinic/overview.csv' }), expect: staff(200) },
  'GET /api/monitoring.csv': { request: () => ({ path: '/api/monitoring.csv?by=client' }), expect: staff(200) },
  'GET /api/clinic/energy': { request: () => ({ path: '/api/clinic/energy' }), expect: staff(200) },
  'PUT /api/clinic/energy': { request: () => ({ path: '/api/clinic/energy', body: { efficiencyPct: null } }), expect: adminOnly(200) },
};
