// An invitation to an e-mail that already has a Kinloop account: the link asks
// for that account's password instead of a new one, and adds the role to the
// same account (DEVELOPERS.md, "Invitations").
import { afterAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { Http } from '../support/http';
import { linkIn, waitForMail } from '../support/mail';
import { createWorld, PASSWORD } from '../support/world';

afterAll(closeDb);

const tokenIn = async (email: string, subject: RegExp) => linkIn(await waitForMail(email, (m) => subject.test(m.subject)), '/invite/').split('/invite/')[1];

describe('an invitation to an e-mail that already has an account', () => {
  it('asks for the account’s password, refuses a wrong one without using the link up, and adds the role to the same account', async () => {
    const world = await createWorld('invite-known');
    const therapist = await world.as('therapist');
    const carer = world.users.carer;
    // The carer of one client is invited as the carer of the clinic's other client.
    const created = await therapist.json('POST', '/api/invitations', { email: carer.email, role: 'carer', clientId: world.otherClientId, relationship: 'friend' });
    expect(created.status).toBe(201);
    const token = await tokenIn(carer.email, /invites you/);

    const page = await new Http().get(`/invite/${token}`);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain('You already have a Kinloop account: confirm with its password.');

    const wrong = await new Http().json('POST', '/api/invitations/accept', { token, password: 'not-the-password-1' });
    expect(wrong.status).toBe(401);
    expect(wrong.body.error).toMatchObject({ code: 'bad_credentials', message: 'An account with this e-mail already exists: enter its current password to accept the invitation.' });

    const invitee = new Http();
    const accepted = await invitee.json('POST', '/api/invitations/accept', { token, password: PASSWORD });
    expect(accepted.status).toBe(200);
    const me = (await invitee.json('GET', '/api/me')).body;
    expect(me.id).toBe(carer.id);
    expect([...me.carerOf].sort()).toEqual([world.clientId, world.otherClientId].sort());
    // One account, its name and password as they were.
    const rows = await world.knex('users').whereRaw('lower(email) = lower(?)', [carer.email]).select('id', 'name');
    expect(rows).toEqual([{ id: carer.id, name: carer.name }]);
    expect((await new Http().json('POST', '/api/auth/sign-in', { email: carer.email, password: PASSWORD })).status).toBe(200);
    // The link is used up now.
    expect((await new Http().json('POST', '/api/invitations/accept', { token, password: PASSWORD })).status).toBe(410);
  });

  it('makes a rider a therapist of the clinic as well, keeping their own record', async () => {
    const world = await createWorld('invite-rider');
    const admin = await world.as('admin');
    const rider = world.users.client;
    expect((await admin.json('POST', '/api/invitations', { email: rider.email, role: 'therapist', name: 'Ignored Name' })).status).toBe(201);
    const token = await tokenIn(rider.email, /invites you/);
    const invitee = new Http();
    expect((await invitee.json('POST', '/api/invitations/accept', { token, password: PASSWORD })).status).toBe(200);
    const me = (await invitee.json('GET', '/api/me')).body;
    expect(me.memberships).toEqual([{ clinicId: world.clinicId, role: 'therapist' }]);
    expect(me.clientId).toBe(world.clientId);
    expect(await world.knex('users').where({ id: rider.id }).first('name')).toEqual({ name: rider.name });
  });
});
