// Only one reset link of an account works at a time: a newer link, a
// completed reset or a new password withdraws every other outstanding one.
import { createHash, randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { Http } from '../support/http';
import { allMail, linkIn, waitForMail } from '../support/mail';
import { createWorld, PASSWORD, type World } from '../support/world';

let world: World;
beforeAll(async () => {
  world = await createWorld('resets');
});
afterAll(closeDb);

const tokenOf = (link: string) => link.split('/reset/')[1];
const reset = (token: string, password: string) => new Http().json('POST', '/api/auth/reset', { token, password });

/** The tokens of the reset e-mails to `email`, oldest first, once there are `n`. */
async function resetLinks(email: string, n: number): Promise<string[]> {
  const deadline = Date.now() + 20_000;
  for (;;) {
    const mails = (await allMail()).filter((m) => m.to.includes(email) && m.subject.includes('Reset'));
    if (mails.length >= n) return mails.map((m) => tokenOf(linkIn(m, '/reset/')));
    if (Date.now() > deadline) throw new Error(`${n} reset e-mails to ${email} did not arrive within 20 s`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** A link stored the way a link made before this rule would be: outstanding beside another one. */
async function storedLink(userId: string): Promise<string> {
  const token = randomBytes(32).toString('base64url');
  await world.knex('password_resets').insert({ user_id: userId, token_hash: createHash('sha256').update(token).digest('hex'), expires_at: new Date(Date.now() + 3_600_000) });
  return token;
}

describe('reset links', () => {
  it('a newer link withdraws the older one: the older link’s page and its use are refused, the newer works', async () => {
    const staff = await world.addStaff('therapist');
    await new Http().post('/api/auth/reset-request', { email: staff.email });
    const [older] = await resetLinks(staff.email, 1);
    await new Http().post('/api/auth/reset-request', { email: staff.email });
    const [, newer] = await resetLinks(staff.email, 2);
    expect((await new Http().get(`/reset/${older}`)).status).toBe(410);
    const refused = await reset(older, 'older-link-password-1');
    expect(refused.status).toBe(410);
    expect(refused.body.error.message).toMatch(/replaced by a newer one/);
    expect((await reset(newer, 'newer-link-password-1')).status).toBe(200);
    expect((await new Http().request('POST', '/api/auth/sign-in', { email: staff.email, password: 'newer-link-password-1' })).status).toBe(200);
  });

  it('a completed reset withdraws every other outstanding link of the account', async () => {
    const staff = await world.addStaff('therapist');
    const first = await storedLink(staff.id);
    const second = await storedLink(staff.id);
    expect((await reset(second, 'second-link-password')).status).toBe(200);
    expect((await reset(first, 'first-link-password-1')).status).toBe(410);
    expect((await new Http().get(`/reset/${first}`)).status).toBe(410);
  });

  it('a password set another way (accepting an invitation to an account without one) withdraws the account’s links', async () => {
    const email = `nopassword.${world.tag}@example.test`;
    const [user] = await world.knex('users').insert({ email, name: 'No Password Yet', password_hash: null }).returning('id');
    const outstanding = await storedLink(user.id);
    const admin = await world.as('admin');
    expect((await admin.post('/api/invitations', { email, role: 'therapist' })).status).toBe(201);
    const token = linkIn(await waitForMail(email, (m) => m.subject.includes('invites you')), '/invite/').split('/invite/')[1];
    expect((await new Http().json('POST', '/api/invitations/accept', { token, name: 'Now Has One', password: 'chosen-password-1' })).status).toBe(200);
    expect((await reset(outstanding, 'hijack-password-1')).status).toBe(410);
    expect((await new Http().request('POST', '/api/auth/sign-in', { email, password: 'chosen-password-1' })).status).toBe(200);
    expect((await new Http().request('POST', '/api/auth/sign-in', { email, password: PASSWORD })).status).toBe(401);
  });
});
