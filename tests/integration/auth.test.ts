import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { Http } from '../support/http';
import { linkIn, waitForMail } from '../support/mail';
import { createWorld, PASSWORD, type World } from '../support/world';

let world: World;
beforeAll(async () => {
  world = await createWorld('auth');
});
afterAll(closeDb);

describe('sign-in', () => {
  it('signs in with the right password, sets a signed HttpOnly SameSite=Lax cookie, and /api/me knows the roles', async () => {
    const http = new Http();
    const res = await http.request('POST', '/api/auth/sign-in', { email: world.users.carer.email.toUpperCase(), password: PASSWORD });
    expect(res.status).toBe(200);
    const cookie = res.headers.getSetCookie().find((c) => c.startsWith('kinloop_session='))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i); // PUBLIC_URL is plain http in tests
    const body = await res.json();
    expect(body.home).toBe('/carer');
    const me = await http.json('GET', '/api/me');
    expect(me.status).toBe(200);
    expect(me.body).toEqual({ id: world.users.carer.id, email: world.users.carer.email, name: 'Cara Carer', memberships: [], carerOf: [world.clientId] });
  });

  it('answers 401 with the same generic message for a wrong password and an unknown e-mail', async () => {
    const http = new Http();
    const wrong = await http.json('POST', '/api/auth/sign-in', { email: world.users.therapist.email, password: 'not-it-at-all' });
    const unknown = await http.json('POST', '/api/auth/sign-in', { email: `nobody.${world.tag}@example.test`, password: 'not-it-at-all' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body.error.message).toBe(unknown.body.error.message);
    expect(http.cookie).toBeNull();
  });

  // The sign-in limits have a file of their own: sign-in-limits.test.ts.

  it('sign-out revokes the session on the server: the same cookie no longer works', async () => {
    const http = await new Http().signIn(world.users.therapist.email, PASSWORD);
    const cookie = http.cookie;
    expect((await http.post('/api/auth/sign-out')).status).toBe(200);
    const replay = new Http();
    replay.cookie = cookie;
    expect((await replay.get('/api/me')).status).toBe(401);
  });

  it('an expired session, an idle session and a disabled user are refused at once', async () => {
    const expired = await new Http().signIn(world.users.client.email, PASSWORD);
    const idle = await new Http().signIn(world.users.client.email, PASSWORD);
    const sessionOf = async (http: Http) => {
      const me = await http.json('GET', '/api/me');
      expect(me.status).toBe(200);
      const rows = await world.knex('auth_sessions').where({ user_id: world.users.client.id }).orderBy('created_at', 'desc');
      return rows;
    };
    const rows = await sessionOf(expired);
    await world.knex('auth_sessions').where({ id: rows[1].id }).update({ expires_at: new Date(Date.now() - 1000) });
    await world.knex('auth_sessions').where({ id: rows[0].id }).update({ last_seen_at: new Date(Date.now() - 8 * 86_400_000) });
    expect((await expired.get('/api/me')).status).toBe(401);
    expect((await idle.get('/api/me')).status).toBe(401);

    const staff = await world.addStaff('therapist');
    const http = await new Http().signIn(staff.email, PASSWORD);
    const admin = await world.as('admin');
    expect((await admin.patch(`/api/staff/${staff.id}`, { disabled: true })).status).toBe(200);
    expect((await http.get('/api/me')).status).toBe(401);
    expect((await new Http().request('POST', '/api/auth/sign-in', { email: staff.email, password: PASSWORD })).status).toBe(401);
  });

  it('unsigned or tampered cookies are ignored', async () => {
    const http = await new Http().signIn(world.users.carer.email, PASSWORD);
    const forged = new Http();
    forged.cookie = http.cookie!.slice(0, -3) + 'abc';
    expect((await forged.get('/api/me')).status).toBe(401);
  });
});

describe('origin checks', () => {
  it('refuses a JSON POST and a form POST from another site, accepts them from the app', async () => {
    const http = await new Http().signIn(world.users.therapist.email, PASSWORD);
    const evil = { origin: 'http://evil.example' };
    expect((await http.request('POST', '/api/invitations', { email: 'a@b.test', role: 'carer', clientId: world.clientId }, evil)).status).toBe(403);
    const form = new FormData();
    form.set('x', '1');
    expect((await http.request('POST', '/sign-out', form, evil)).status).toBe(403);
    expect((await http.request('POST', '/api/invitations', { email: `ok.${world.tag}@example.test`, role: 'carer', clientId: world.clientId }, { origin: http.origin })).status).toBe(201);
  });
});

describe('audit log', () => {
  it('records sign-in, failed sign-in, sign-out and reading a client record', async () => {
    const staff = await world.addStaff('therapist');
    const http = new Http();
    await http.request('POST', '/api/auth/sign-in', { email: staff.email, password: 'wrong-password-x' });
    await http.signIn(staff.email, PASSWORD);
    await http.get(`/api/clients/${world.clientId}`);
    await http.post('/api/auth/sign-out');
    const actions = (await world.knex('audit_log').where({ actor_user_id: staff.id }).orderBy('id').select('action', 'client_id', 'ip')).map((r) => r.action);
    expect(actions).toEqual(['auth.sign_in_failed', 'auth.sign_in', 'client.view', 'auth.sign_out']);
    const view = await world.knex('audit_log').where({ actor_user_id: staff.id, action: 'client.view' }).first();
    expect(view.client_id).toBe(world.clientId);
    expect(view.ip).toBe(http.address.split(',').pop()!.trim());
  });
});

describe('invitations by e-mail', () => {
  it('an admin invites a therapist; the link sets a password, signs them in, and works only once', async () => {
    const admin = await world.as('admin');
    const email = `new.therapist.${world.tag}@example.test`;
    const created = await admin.json('POST', '/api/invitations', { email, role: 'therapist', name: 'Nia New' });
    expect(created.status).toBe(201);
    const mail = await waitForMail(email, (m) => m.subject.includes('invites you'));
    expect(mail.to).toEqual([email]);
    expect(mail.html).toContain('Accept the invitation');
    const link = linkIn(mail, '/invite/');
    const token = link.split('/invite/')[1];
    const page = await new Http().get(`/invite/${token}`);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain(email);
    const invitee = new Http();
    const accepted = await invitee.json('POST', '/api/invitations/accept', { token, name: 'Nia New', password: 'a-long-new-password' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.home).toBe('/triage');
    const me = await invitee.json('GET', '/api/me');
    expect(me.body.memberships).toEqual([{ clinicId: world.clinicId, role: 'therapist' }]);
    const again = await new Http().json('POST', '/api/invitations/accept', { token, name: 'Nia New', password: 'another-password-1' });
    expect(again.status).toBe(410);
    expect((await new Http().get(`/invite/${token}`)).status).toBe(410);
    // The token is stored hashed, never as sent.
    expect(await world.knex('invitations').where({ token_hash: token }).first()).toBeUndefined();
  });

  it('a therapist invites a carer and the client; a therapist cannot invite staff', async () => {
    const therapist = await world.as('therapist');
    expect((await therapist.json('POST', '/api/invitations', { email: `x.${world.tag}@example.test`, role: 'therapist' })).status).toBe(403);

    const carerEmail = `second.carer.${world.tag}@example.test`;
    expect((await therapist.json('POST', '/api/invitations', { email: carerEmail, role: 'carer', clientId: world.otherClientId, relationship: 'daughter' })).status).toBe(201);
    const carerToken = linkIn(await waitForMail(carerEmail), '/invite/').split('/invite/')[1];
    const carer = new Http();
    expect((await carer.json('POST', '/api/invitations/accept', { token: carerToken, name: 'Dot Daughter', password: 'carer-password-1' })).body.home).toBe('/carer');
    expect((await carer.json('GET', '/api/me')).body.carerOf).toEqual([world.otherClientId]);

    const clientEmail = `oona.${world.tag}@example.test`;
    expect((await therapist.json('POST', '/api/invitations', { email: clientEmail, role: 'client', clientId: world.otherClientId })).status).toBe(201);
    const clientToken = linkIn(await waitForMail(clientEmail), '/invite/').split('/invite/')[1];
    const client = new Http();
    expect((await client.json('POST', '/api/invitations/accept', { token: clientToken, name: 'Oona Second', password: 'client-password-1' })).body.home).toBe('/my-week');
    expect((await client.json('GET', '/api/me')).body.clientId).toBe(world.otherClientId);
    // The client now has an account: a second client invitation is refused.
    expect((await therapist.json('POST', '/api/invitations', { email: `again.${world.tag}@example.test`, role: 'client', clientId: world.otherClientId })).status).toBe(409);
  });

  it('an expired invitation is refused', async () => {
    const therapist = await world.as('therapist');
    const email = `late.${world.tag}@example.test`;
    const created = await therapist.json('POST', '/api/invitations', { email, role: 'carer', clientId: world.clientId });
    const token = linkIn(await waitForMail(email), '/invite/').split('/invite/')[1];
    await world.knex('invitations').where({ id: created.body.id }).update({ expires_at: new Date(Date.now() - 1000) });
    expect((await new Http().json('POST', '/api/invitations/accept', { token, name: 'Late', password: 'late-password-1' })).status).toBe(410);
  });
});

describe('password reset by e-mail', () => {
  it('sends a single-use link that sets a new password, signs in and ends the other sessions', async () => {
    const staff = await world.addStaff('therapist');
    const old = await new Http().signIn(staff.email, PASSWORD);
    const res = await new Http().json('POST', '/api/auth/reset-request', { email: staff.email });
    expect(res.status).toBe(202);
    const unknown = await new Http().json('POST', '/api/auth/reset-request', { email: `nobody.${world.tag}@example.test` });
    expect(unknown.body).toEqual(res.body);
    const token = linkIn(await waitForMail(staff.email, (m) => m.subject.includes('Reset')), '/reset/').split('/reset/')[1];
    expect((await new Http().get(`/reset/${token}`)).status).toBe(200);
    const fresh = new Http();
    const done = await fresh.json('POST', '/api/auth/reset', { token, password: 'brand-new-password-9' });
    expect(done.status).toBe(200);
    expect((await fresh.get('/api/me')).status).toBe(200);
    expect((await old.get('/api/me')).status).toBe(401);
    expect((await new Http().json('POST', '/api/auth/reset', { token, password: 'yet-another-password' })).status).toBe(410);
    expect((await new Http().request('POST', '/api/auth/sign-in', { email: staff.email, password: PASSWORD })).status).toBe(401);
    expect((await new Http().request('POST', '/api/auth/sign-in', { email: staff.email, password: 'brand-new-password-9' })).status).toBe(200);
  });

  it('an expired reset link is refused', async () => {
    const staff = await world.addStaff('therapist');
    await new Http().json('POST', '/api/auth/reset-request', { email: staff.email });
    const token = linkIn(await waitForMail(staff.email), '/reset/').split('/reset/')[1];
    await world.knex('password_resets').where({ user_id: staff.id }).update({ expires_at: new Date(Date.now() - 1000) });
    expect((await new Http().json('POST', '/api/auth/reset', { token, password: 'brand-new-password-9' })).status).toBe(410);
  });
});

describe('pages', () => {
  it('redirect to sign-in without a session, and keep where the user was going', async () => {
    const res = await new Http().get('/clients');
    expect(res.status).toBe(302);
    expect(res.headers.get('location')).toBe('/sign-in?next=%2Fclients');
  });

  it('answer 403 with an explanation for a page outside the role', async () => {
    const carer = await world.as('carer');
    const res = await carer.get('/admin/staff');
    expect(res.status).toBe(403);
    expect(await res.text()).toContain('This page is for other roles');
  });

  it('health reports every service ok', async () => {
    expect(await new Http().json('GET', '/api/health')).toEqual({ status: 200, body: { db: 'ok', storage: 'ok', mail: 'ok' } });
  });
});
