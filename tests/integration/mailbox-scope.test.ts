// The dev mailbox shows an admin only the mail of their own clinic's people:
// a reset or invitation link of another clinic would open that clinic.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { Http } from '../support/http';
import { linkIn, waitForMail } from '../support/mail';
import { createWorld, type World } from '../support/world';

let world: World;
beforeAll(async () => {
  world = await createWorld('mailbox');
});
afterAll(closeDb);

async function mailboxOf(http: Http): Promise<{ text: string; messages: { to: string[]; text: string }[] }> {
  const res = await http.json<{ messages: { to: string[]; text: string }[] }>('GET', '/api/dev/mailbox');
  expect(res.status).toBe(200);
  return { text: JSON.stringify(res.body), messages: res.body.messages };
}

describe('the dev mailbox', () => {
  it('a second clinic’s admin cannot read the reset link they asked for another clinic’s admin; that clinic’s admin can', async () => {
    const adminB = await world.as('otherAdmin');
    // Anyone may ask for a reset of any e-mail: the link goes to the mailbox.
    expect((await adminB.post('/api/auth/reset-request', { email: world.users.admin.email })).status).toBe(202);
    const mail = await waitForMail(world.users.admin.email, (m) => m.subject.includes('Reset'));
    const token = linkIn(mail, '/reset/').split('/reset/')[1];

    const seenByB = await mailboxOf(adminB);
    expect(seenByB.text).not.toContain(token);
    expect(seenByB.text).not.toContain(world.users.admin.email);
    expect(seenByB.text).not.toContain(world.users.therapist.email);

    const seenByA = await mailboxOf(await world.as('admin'));
    expect(seenByA.text).toContain(token);
  });

  it('a pending invitation of one clinic is shown to that clinic’s admin only', async () => {
    const email = `pending.${world.tag}@example.test`;
    expect((await (await world.as('admin')).post('/api/invitations', { email, role: 'therapist' })).status).toBe(201);
    const token = linkIn(await waitForMail(email), '/invite/').split('/invite/')[1];
    expect((await mailboxOf(await world.as('otherAdmin'))).text).not.toContain(token);
    expect((await mailboxOf(await world.as('admin'))).text).toContain(token);
  });

  it('the second clinic’s admin still reads their own people’s mail', async () => {
    const adminB = await world.as('otherAdmin');
    expect((await new Http().post('/api/auth/reset-request', { email: world.users.otherTherapist.email })).status).toBe(202);
    const token = linkIn(await waitForMail(world.users.otherTherapist.email, (m) => m.subject.includes('Reset')), '/reset/').split('/reset/')[1];
    expect((await mailboxOf(adminB)).text).toContain(token);
    expect((await mailboxOf(await world.as('admin'))).text).not.toContain(token);
  });

  it('mail to someone of both clinics is shown to neither admin: their link would open the other clinic', async () => {
    const both = await world.addStaff('therapist');
    await world.knex('memberships').insert({ user_id: both.id, clinic_id: world.otherClinicId, role: 'therapist' });
    expect((await new Http().post('/api/auth/reset-request', { email: both.email })).status).toBe(202);
    const token = linkIn(await waitForMail(both.email, (m) => m.subject.includes('Reset')), '/reset/').split('/reset/')[1];
    expect((await mailboxOf(await world.as('admin'))).text).not.toContain(token);
    expect((await mailboxOf(await world.as('otherAdmin'))).text).not.toContain(token);
  });

  it('is for admins only', async () => {
    expect((await (await world.as('therapist')).get('/api/dev/mailbox')).status).toBe(403);
    expect((await (await world.as('carer')).get('/api/dev/mailbox')).status).toBe(403);
  });
});
