// Sign-in limits: counted atomically (parallel attempts never get more than
// the limit evaluated), per e-mail and address, per address, and a slowdown
// per e-mail that a browser where the owner signed in before does not feel.
// Accepting an invitation with an existing account's password is an attempt too.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { Http } from '../support/http';
import { linkIn, waitForMail } from '../support/mail';
import { createWorld, PASSWORD, type World } from '../support/world';

// The limits as DEVELOPERS.md states them ("Sign-in limits"), written out here rather than imported.
const PAIR_LIMIT = 10;
const ADDRESS_LIMIT = 30;
const SLOWDOWN_SECONDS = 30;

let world: World;
beforeAll(async () => {
  world = await createWorld('limits');
});
afterAll(closeDb);

const signIn = (http: Http, email: string, password: string) => http.request('POST', '/api/auth/sign-in', { email, password });
const statuses = (list: Response[]) => list.map((r) => r.status).sort();
const count = (list: number[], status: number) => list.filter((s) => s === status).length;

describe('sign-in limits', () => {
  it('20 parallel wrong passwords from one address: exactly the limit of 10 are evaluated, the rest refused with 429', async () => {
    const target = await world.addStaff('therapist');
    const attacker = new Http();
    const answers = await Promise.all(Array.from({ length: 20 }, (_, i) => signIn(attacker, target.email, `wrong-password-${i}`)));
    const got = statuses(answers);
    expect(count(got, 401)).toBe(PAIR_LIMIT);
    expect(count(got, 429)).toBe(20 - PAIR_LIMIT);
    // The failures stored are the evaluated ones: no more than the limit.
    const stored = await world.knex('sign_in_attempts').where({ email: target.email.toLowerCase(), succeeded: false }).count<{ n: string }[]>('* as n');
    expect(Number(stored[0].n)).toBe(PAIR_LIMIT);
    // That address is blocked for this account even with the right password.
    const again = await signIn(attacker, target.email, PASSWORD);
    expect(again.status).toBe(429);
    expect(Number(again.headers.get('retry-after'))).toBeGreaterThan(60);
  });

  it('the owner is not locked out by an attacker elsewhere: their browser signs in at once, a new browser waits seconds, not minutes', async () => {
    const owner = await world.addStaff('therapist');
    // The owner signed in on this browser before: it holds a trusted-device cookie.
    const ownBrowser = await new Http().signIn(owner.email, PASSWORD);
    expect(ownBrowser.device).toMatch(/^kinloop_device=/);
    // Attackers on several addresses keep guessing.
    const attackers = Array.from({ length: 4 }, () => new Http());
    await Promise.all(attackers.flatMap((a, i) => Array.from({ length: 5 }, (_, j) => signIn(a, owner.email, `guess-${i}-${j}-password`))));

    // A browser that never signed in meets the per-account slowdown: seconds, and it says so.
    const newBrowser = await new Http().json('POST', '/api/auth/sign-in', { email: owner.email, password: PASSWORD });
    expect(newBrowser.status).toBe(429);
    expect(newBrowser.body.error.message).toMatch(/try again in \d+ seconds?/);
    expect(newBrowser.body.error.retryAfterSeconds).toBeLessThanOrEqual(SLOWDOWN_SECONDS);

    const fromOwnBrowser = await signIn(ownBrowser, owner.email, PASSWORD);
    expect(fromOwnBrowser.status).toBe(200);
  });

  it('a successful sign-in from an address clears that address’s failures for the account', async () => {
    const user = await world.addStaff('therapist');
    const http = new Http();
    for (let i = 0; i < PAIR_LIMIT - 1; i++) expect((await signIn(http, user.email, `typo-${i}-password`)).status).toBe(401);
    expect((await signIn(http, user.email, PASSWORD)).status).toBe(200);
    // Nine more typos after the success still leave room (a plain window count would now be blocked).
    for (let i = 0; i < PAIR_LIMIT - 1; i++) expect((await signIn(http, user.email, `typo-again-${i}`)).status).toBe(401);
  });

  it(`one address trying many e-mails: ${ADDRESS_LIMIT} failures are evaluated, even in parallel; other addresses and the owner's own browser are unaffected`, { timeout: 120_000 }, async () => {
    const owner = await world.addStaff('admin');
    const shared = new Http();
    // The owner signed in from this same address before the attack (a shared office connection).
    await shared.signIn(owner.email, PASSWORD);
    const attacker = new Http();
    attacker.address = shared.address;
    const answers = await Promise.all(
      Array.from({ length: ADDRESS_LIMIT + 10 }, (_, i) => signIn(attacker, `guess${i}.${randomUUID().slice(0, 6)}.${world.tag}@example.test`, 'wrong-password')),
    );
    const got = statuses(answers);
    expect(count(got, 401)).toBe(ADDRESS_LIMIT);
    expect(count(got, 429)).toBe(10);
    expect((await signIn(attacker, world.users.therapist.email, PASSWORD)).status).toBe(429);
    // The owner's browser on the same address carries its device cookie and gets in.
    expect((await signIn(shared, owner.email, PASSWORD)).status).toBe(200);
    // Another address is not affected.
    expect((await signIn(new Http(), world.users.therapist.email, PASSWORD)).status).toBe(200);
  });

  it('only the account’s own, genuine device cookie passes the slowdown: not another account’s, not a forged one', async () => {
    const user = await world.addStaff('therapist');
    const ownBrowser = await new Http().signIn(user.email, PASSWORD);
    const otherAccount = await new Http().signIn(world.users.admin.email, PASSWORD);
    const attacker = new Http();
    await Promise.all(Array.from({ length: PAIR_LIMIT }, (_, i) => signIn(attacker, user.email, `wrong-${i}-password`)));

    const borrowed = new Http();
    borrowed.device = otherAccount.device;
    expect((await signIn(borrowed, user.email, PASSWORD)).status).toBe(429);
    const forged = new Http();
    forged.device = `${ownBrowser.device!.slice(0, -4)}AAAA`;
    expect((await signIn(forged, user.email, PASSWORD)).status).toBe(429);
    expect((await signIn(ownBrowser, user.email, PASSWORD)).status).toBe(200);
  });

  it('accepting an invitation with an existing account’s password is a sign-in attempt under the same limits', async () => {
    const existing = await world.addStaff('therapist');
    // The owner's browser, where they signed in before any of this.
    const ownBrowser = await new Http().signIn(existing.email, PASSWORD);
    const therapist = await world.as('therapist');
    expect((await therapist.post('/api/invitations', { email: existing.email, role: 'carer', clientId: world.otherClientId })).status).toBe(201);
    const token = linkIn(await waitForMail(existing.email, (m) => m.subject.includes('invites you')), '/invite/').split('/invite/')[1];
    const guesser = new Http();
    const answers = await Promise.all(Array.from({ length: 15 }, (_, i) => guesser.request('POST', '/api/invitations/accept', { token, password: `not-the-password-${i}` })));
    const got = statuses(answers);
    expect(count(got, 401)).toBe(PAIR_LIMIT);
    expect(count(got, 429)).toBe(15 - PAIR_LIMIT);
    // Now even the right password is refused from this address, on the invitation and on the sign-in form.
    expect((await guesser.request('POST', '/api/invitations/accept', { token, password: PASSWORD })).status).toBe(429);
    expect((await signIn(guesser, existing.email, PASSWORD)).status).toBe(429);
    const failures = await world.knex('audit_log').where({ action: 'auth.sign_in_failed', actor_user_id: existing.id }).whereRaw("detail->>'via' = 'invitation'").count<{ n: string }[]>('* as n');
    expect(Number(failures[0].n)).toBe(PAIR_LIMIT);
    // The invitation itself still works for the owner elsewhere, from their own browser.
    const accepted = await ownBrowser.json('POST', '/api/invitations/accept', { token, password: PASSWORD });
    expect(accepted.status).toBe(200);
    expect(accepted.body.user.carerOf).toEqual([world.otherClientId]);
  });
});
