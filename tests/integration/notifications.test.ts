// Scheduled e-mails (reminders, weekly summary, daily digest): the right
// recipients only, once per day or week, and an unsubscribe link that works
// without signing in.
import { DateTime } from 'luxon';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { sendScheduledEmails } from '../../src/lib/notifications/scheduled';
import { Http } from '../support/http';
import { allMail, linkIn, waitForMail } from '../support/mail';
import { ride } from '../support/scenario';
import { createWorld, type World } from '../support/world';

let world: World;
beforeAll(async () => {
  world = await createWorld('mail');
  const therapist = await world.as('therapist');
  // The world's client rides three times a week from six weeks ago.
  await therapist.json('PUT', `/api/clients/${world.clientId}/prescription`, { sessionsPerWeek: 3, minutesPerSession: 30, effectiveFrom: DateTime.now().setZone('Europe/London').startOf('week').minus({ weeks: 6 }).toISODate() });
});
afterAll(closeDb);

const mailTo = async (email: string, subject: RegExp) => (await allMail()).filter((m) => m.to.includes(email) && subject.test(m.subject));

describe('reminders', () => {
  it('go to the rider and their carer when a ride is due and none has come by the evening — once a day, and not to staff', async () => {
    // A Monday evening of a future week with no rides yet: the first ride of the week is due.
    const monday = DateTime.now().setZone('Europe/London').startOf('week').plus({ weeks: 1 }).set({ hour: 19 });
    const first = await sendScheduledEmails(world.knex, monday.toJSDate());
    expect(first.reminders).toBeGreaterThanOrEqual(2);
    const toClient = await waitForMail(world.users.client.email, (m) => m.subject === 'A ride is due today');
    await waitForMail(world.users.carer.email, (m) => m.subject.startsWith('A ride is due today for'));
    expect(toClient.text).toContain('/unsubscribe/');
    const again = await sendScheduledEmails(world.knex, monday.plus({ hours: 2 }).toJSDate());
    expect(again.reminders).toBe(0);
    await new Promise((r) => setTimeout(r, 2500));
    expect(await mailTo(world.users.client.email, /^A ride is due today$/)).toHaveLength(1);
    expect(await mailTo(world.users.therapist.email, /ride is due/)).toEqual([]);
  });

  it('are not sent before the evening, nor when a ride already came that day', async () => {
    const therapist = await world.as('therapist');
    const day = DateTime.now().setZone('Europe/London').startOf('week').minus({ weeks: 1 });
    // Counted for this world's client only: other test files' clients may be due that day too.
    const reminders = async () => Number((await world.knex('outbox_emails').where('dedupe_key', 'like', `reminder:%:${world.clientId}:${day.toISODate()}`).count<{ n: string }[]>('* as n'))[0].n);
    await sendScheduledEmails(world.knex, day.set({ hour: 15 }).toJSDate());
    expect(await reminders()).toBe(0);
    await ride(therapist, world.clientId, [{ weeksAgo: 1, day: 0 }]);
    await sendScheduledEmails(world.knex, day.set({ hour: 20 }).toJSDate());
    expect(await reminders()).toBe(0);
  });
});

describe('weekly summary and daily digest', () => {
  it('the rider gets a weekly summary on Monday morning; therapists get the digest of their clients’ flags', async () => {
    await world.knex('flags').insert({ client_id: world.clientId, clinic_id: world.clinicId, kind: 'short_session', severity: 'info', anchor: 'digest-test', reason: 'Two short rides in a row.', evidence: '{}' });
    const monday = DateTime.now().setZone('Europe/London').startOf('week').plus({ weeks: 2 }).set({ hour: 9 });
    const sent = await sendScheduledEmails(world.knex, monday.toJSDate());
    // Every rider in the database with an account is summarised; ours among them.
    expect(sent.weekly).toBeGreaterThanOrEqual(1);
    expect(sent.digests).toBeGreaterThanOrEqual(1);
    const weekly = await waitForMail(world.users.client.email, (m) => m.subject.startsWith('Your riding last week'));
    expect(weekly.text).toMatch(/streak/i);
    const digest = await waitForMail(world.users.therapist.email, (m) => m.subject.includes('flag') && m.text.includes('Two short rides in a row.'));
    // Judged two weeks ahead, the flag is no longer new but still open.
    expect(digest.text).toMatch(/Still open: Cal Client — Short sessions \(info\): Two short rides in a row\./);
    expect(await mailTo(world.users.otherTherapist.email, /flag/)).toEqual([]);
    expect(await mailTo(world.users.carer.email, /Your riding last week/)).toEqual([]);
  });
});

describe('unsubscribing', () => {
  it('works from the e-mail link without signing in, and stops that kind of e-mail', async () => {
    const mail = await waitForMail(world.users.carer.email, (m) => m.subject.startsWith('A ride is due today for'));
    const link = new URL(linkIn(mail, '/unsubscribe/'));
    const anonymous = new Http();
    const page = await anonymous.get(link.pathname + link.search);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain(world.users.carer.email);
    const form = new URLSearchParams();
    const done = await anonymous.request('POST', link.pathname + link.search, form, { 'content-type': 'application/x-www-form-urlencoded' });
    expect(done.status).toBe(200);
    expect(await done.text()).toContain('no more reminders');
    const carer = await world.as('carer');
    expect((await carer.json('GET', '/api/me/notifications')).body).toMatchObject({ reminders: false, urgentAlerts: true });
    const tuesday = DateTime.now().setZone('Europe/London').startOf('week').plus({ weeks: 3 }).set({ hour: 19 });
    await sendScheduledEmails(world.knex, tuesday.toJSDate());
    await waitForMail(world.users.client.email, (m) => m.subject === 'A ride is due today' && m.receivedAt > mail.receivedAt && m.text.length > 0);
    await new Promise((r) => setTimeout(r, 2500));
    expect((await mailTo(world.users.carer.email, /^A ride is due today for/)).length).toBe(1);
  });
});
