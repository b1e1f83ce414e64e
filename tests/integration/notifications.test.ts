// Scheduled e-mails (reminders, weekly summary, daily digest) and urgent
// alerts: the right recipients only, once per day, week or episode, the
// numbers they carry, and an unsubscribe link that works without signing in.
// Each test builds its own clinics and runs the hourly job for them alone, so
// no other file's clients are e-mailed and every count is this test's own.
// The running app's own hourly job works on real dates: the dates here are
// chosen so that it cannot have queued the same e-mail first.
import { DateTime } from 'luxon';
import { afterAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import type { FlagRow } from '../../src/lib/db/tables';
import { alertUrgentFlag } from '../../src/lib/notifications/alerts';
import { sendScheduledEmails } from '../../src/lib/notifications/scheduled';
import { evaluateClientFlags } from '../../src/lib/supervision/flag-store';
import { Http } from '../support/http';
import { linkIn, waitForMail } from '../support/mail';
import { ride } from '../support/scenario';
import { createWorld, type World } from '../support/world';

afterAll(closeDb);

const LONDON = 'Europe/London';
const thisMonday = () => DateTime.now().setZone(LONDON).startOf('week');

/** A world whose client rides three times a week, 30 minutes, from six weeks ago. */
async function worldWithProgram(label: string): Promise<World> {
  const world = await createWorld(label);
  const therapist = await world.as('therapist');
  const rx = await therapist.json('PUT', `/api/clients/${world.clientId}/prescription`, { sessionsPerWeek: 3, minutesPerSession: 30, effectiveFrom: thisMonday().minus({ weeks: 6 }).toISODate() });
  expect(rx.status).toBe(201);
  return world;
}

const run = (world: World, at: DateTime) => sendScheduledEmails(world.knex, at.toJSDate(), { clinicIds: [world.clinicId] });

/** The e-mails queued with this dedupe key (what the outbox will send), whatever the mailbox has received so far. */
const queued = (world: World, dedupeKey: string) => world.knex('outbox_emails').where({ dedupe_key: dedupeKey }).select('to_address', 'subject', 'text_body');
const queuedTo = (world: World, email: string, kind: string) => world.knex('outbox_emails').where({ to_address: email, kind }).select('dedupe_key', 'subject', 'text_body');

describe('reminders', () => {
  it('go to the rider and their carer when a ride is due and none has come by the evening — once a day, and not to staff', async () => {
    const world = await worldWithProgram('remind');
    // A Monday evening two weeks ahead with no rides yet: the first ride of the week is due.
    const monday = thisMonday().plus({ weeks: 2 }).set({ hour: 19 });
    expect(await run(world, monday)).toMatchObject({ reminders: 2 });
    const toClient = await waitForMail(world.users.client.email, (m) => m.subject === 'A ride is due today');
    await waitForMail(world.users.carer.email, (m) => m.subject === 'A ride is due today for Cal Client');
    expect(toClient.text).toContain('/unsubscribe/');

    expect(await run(world, monday.plus({ hours: 2 }))).toMatchObject({ reminders: 0 });
    const day = monday.toISODate();
    expect(await queued(world, `reminder:${world.users.client.id}:${world.clientId}:${day}`)).toHaveLength(1);
    expect(await queued(world, `reminder:${world.users.carer.id}:${world.clientId}:${day}`)).toHaveLength(1);
    for (const staff of [world.users.therapist, world.users.admin]) expect(await queuedTo(world, staff.email, 'reminder')).toEqual([]);
  });

  it('are not sent before the evening, nor when a ride already came that day', async () => {
    const world = await worldWithProgram('remind-ride');
    const day = thisMonday().minus({ weeks: 1 });
    expect(await run(world, day.set({ hour: 15 }))).toMatchObject({ reminders: 0 });
    await ride(await world.as('therapist'), world.clientId, [{ weeksAgo: 1, day: 0 }]);
    expect(await run(world, day.set({ hour: 20 }))).toMatchObject({ reminders: 0 });
    expect(await queuedTo(world, world.users.client.email, 'reminder')).toEqual([]);
  });
});

describe('weekly summary', () => {
  it('tells the rider last week’s sessions, active minutes, distance and streak, once', async () => {
    const world = await worldWithProgram('weekly');
    // Last week for a Monday two weeks ahead is next week; its rides are
    // uploaded ahead of time (Kinloop keeps a future start, with a warning).
    const monday = thisMonday().plus({ weeks: 2 }).set({ hour: 9 });
    const lastWeek = thisMonday().plus({ weeks: 1 });
    await ride(await world.as('therapist'), world.clientId, [0, 1, 2, 3].map((day) => ({ weeksAgo: -1, day })));
    expect(await run(world, monday)).toMatchObject({ weekly: 1 });
    const key = lastWeek.toFormat("kkkk-'W'WW"); // luxon's ISO week-year and week
    const [mail] = await queued(world, `weekly:${world.users.client.id}:${key}`);
    // Hand-worked from tests/support/rides.ts: a 30-minute file has 1,800
    // one-second samples, 1,770 of them active at 42 rpm, 30 at 30 rpm, so
    // 29.5 active minutes and 1,770 × 42/60 × 2 m + 30 × 30/60 × 2 m = 2,508 m
    // (2 m a revolution). Four rides: 118 minutes, 10.032 km. Three were
    // prescribed; the week before had none, so the streak is one week.
    expect(mail.subject).toBe('Your riding last week: 4 sessions');
    // The week is written as the date it starts, in the clinic's locale (en-GB for a London clinic).
    const week = `the week of ${lastWeek.setLocale('en-GB').toFormat('d MMMM')}`;
    expect(mail.text_body).toContain(`Last week (${week}) you did 4 sessions of the 3 planned: 118 active minutes and 10.0 km.`);
    expect(mail.text_body).toContain('Your streak: 1 week.');
    expect(await run(world, monday.plus({ hours: 3 }))).toMatchObject({ weekly: 0 });
    expect(await queuedTo(world, world.users.carer.email, 'weekly_summary')).toEqual([]);
  });
});

describe('daily digest', () => {
  it('splits the therapist’s open flags into new (the last 24 hours) and still open, and leaves out closed ones', async () => {
    const world = await createWorld('digest');
    // Tuesday next week, 09:00 in the clinic's zone: past the 07:00 start.
    const now = thisMonday().plus({ weeks: 1, days: 1 }).set({ hour: 9 });
    const flag = (kind: string, severity: string, state: string, raisedHoursAgo: number, reason: string) => ({
      client_id: world.clientId,
      clinic_id: world.clinicId,
      kind,
      severity,
      state,
      anchor: `digest-${kind}`,
      reason,
      evidence: '{}',
      raised_at: now.minus({ hours: raisedHoursAgo }).toJSDate(),
    });
    await world.knex('flags').insert([
      flag('short_session', 'info', 'open', 2, 'Two short rides in a row.'),
      flag('power_drop', 'review', 'acknowledged', 72, 'Mean power 25 % below the usual.'),
      flag('current_rise', 'review', 'resolved', 1, 'Resolved already.'),
      flag('missed_sessions', 'review', 'withdrawn', 1, 'Withdrawn already.'),
    ]);
    expect(await run(world, now)).toMatchObject({ digests: 1 });
    const [digest] = await queued(world, `digest:${world.users.therapist.id}:${now.toISODate()}`);
    expect(digest.to_address).toBe(world.users.therapist.email);
    expect(digest.subject).toBe('Kinloop: 1 new and 1 open flags today');
    expect(digest.text_body).toContain('New: Cal Client — Short sessions (info): Two short rides in a row.');
    expect(digest.text_body).toContain('Still open: Cal Client — Power drop (review, acknowledged): Mean power 25 % below the usual.');
    expect(digest.text_body).not.toContain('already');
    // The client has a primary therapist: the admin and the other clinic get nothing.
    for (const other of [world.users.admin, world.users.otherTherapist, world.users.carer]) expect(await queuedTo(world, other.email, 'daily_digest')).toEqual([]);
    // A flag more than a day old is no longer new.
    const [tomorrow] = await (async () => {
      await run(world, now.plus({ days: 1 }));
      return queued(world, `digest:${world.users.therapist.id}:${now.plus({ days: 1 }).toISODate()}`);
    })();
    expect(tomorrow.subject).toBe('Kinloop: 0 new and 2 open flags today');
  });
});

describe('urgent alerts', () => {
  /** A client of the world's clinic written straight to the database (no job is scheduled for it), prescribed from four weeks ago, who has not ridden. */
  async function silentClient(world: World): Promise<string> {
    const start = thisMonday().minus({ weeks: 4 });
    const [client] = await world.knex('clients')
      .insert({ clinic_id: world.clinicId, display_name: 'Una Urgent', diagnosis: 'sci', time_zone: LONDON, primary_therapist_id: world.users.therapist.id, program_start: start.toISODate() })
      .returning('id');
    await world.knex('prescriptions').insert({ client_id: client.id, version: 1, effective_from: start.toISODate(), sessions_per_week: 3, minutes_per_session: 30, channels: '{}', created_by: world.users.therapist.id });
    return client.id;
  }

  it('go to the client’s therapist once per flag and episode, however often the flag is judged again', async () => {
    const world = await createWorld('urgent');
    const clientId = await silentClient(world);
    const now = DateTime.now();
    const first = await evaluateClientFlags(world.knex, clientId, now.toJSDate());
    expect(first).toEqual([expect.objectContaining({ type: 'raise', condition: expect.objectContaining({ kind: 'missed_sessions', severity: 'urgent' }) })]);
    const row = await world.knex<FlagRow>('flags').where({ client_id: clientId }).first();
    const alerts = () => world.knex('outbox_emails').where('dedupe_key', 'like', `urgent:${row!.id}:%`).select('to_address', 'subject');
    expect(await alerts()).toEqual([{ to_address: world.users.therapist.email, subject: 'Urgent: missed sessions for Una Urgent' }]);

    // A day later the gap is a day longer: the flag is updated, not alerted again.
    const later = await evaluateClientFlags(world.knex, clientId, now.plus({ days: 1 }).toJSDate());
    expect(later).toEqual([expect.objectContaining({ type: 'update', flagId: row!.id })]);
    expect(await alerts()).toHaveLength(1);

    // The same flag with a new episode is a new alert; that episode again is not.
    const updated = (await world.knex<FlagRow>('flags').where({ id: row!.id }).first())!;
    expect(await alertUrgentFlag(world.knex, { ...updated, anchor: 'gap:a-later-episode' })).toBe(1);
    expect(await alertUrgentFlag(world.knex, { ...updated, anchor: 'gap:a-later-episode' })).toBe(0);
    expect(await alerts()).toHaveLength(2);
  });

  it('are not sent for a flag that is acknowledged or whose condition has already cleared', async () => {
    const world = await createWorld('urgent-cleared');
    const clientId = await silentClient(world);
    await evaluateClientFlags(world.knex, clientId);
    const row = (await world.knex<FlagRow>('flags').where({ client_id: clientId }).first())!;
    expect(await alertUrgentFlag(world.knex, { ...row, anchor: 'gap:acknowledged', state: 'acknowledged' })).toBe(0);
    expect(await alertUrgentFlag(world.knex, { ...row, anchor: 'gap:cleared', cleared_at: new Date() })).toBe(0);
    expect(await world.knex('outbox_emails').where('dedupe_key', 'like', `urgent:${row.id}:%`)).toHaveLength(1);
  });
});

describe('unsubscribing', () => {
  it('works from the e-mail link without signing in, and stops that kind of e-mail', async () => {
    const world = await worldWithProgram('unsub');
    const monday = thisMonday().plus({ weeks: 2 }).set({ hour: 19 });
    await run(world, monday);
    const mail = await waitForMail(world.users.carer.email, (m) => m.subject.startsWith('A ride is due today for'));
    const link = new URL(linkIn(mail, '/unsubscribe/'));
    const anonymous = new Http();
    const page = await anonymous.get(link.pathname + link.search);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain(world.users.carer.email);
    const done = await anonymous.request('POST', link.pathname + link.search, new URLSearchParams(), { 'content-type': 'application/x-www-form-urlencoded' });
    expect(done.status).toBe(200);
    expect(await done.text()).toContain('no more reminders');
    const carer = await world.as('carer');
    expect((await carer.json('GET', '/api/me/notifications')).body).toMatchObject({ reminders: false, urgentAlerts: true });
    // The next evening a ride is due again: the rider is reminded, the carer is not.
    const tuesday = monday.plus({ days: 1 });
    expect(await run(world, tuesday)).toMatchObject({ reminders: 1 });
    expect(await queued(world, `reminder:${world.users.client.id}:${world.clientId}:${tuesday.toISODate()}`)).toHaveLength(1);
    expect(await queued(world, `reminder:${world.users.carer.id}:${world.clientId}:${tuesday.toISODate()}`)).toEqual([]);
  });
});
