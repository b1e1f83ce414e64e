// Pre/post-ride checks through the API: the blood-pressure rules at and around
// each threshold, the flags they raise, and who is told.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { waitForMail } from '../support/mail';
import { createWorld, type World } from '../support/world';

let world: World;
beforeAll(async () => {
  world = await createWorld('checks');
});
afterAll(closeDb);

async function clientWith(p: { injuryLevel?: string; adRisk?: string; baseline: number | null }) {
  const therapist = await world.as('therapist');
  const { body } = await therapist.json('POST', '/api/clients', { name: `Check ${Math.random().toString(36).slice(2, 7)}`, timezone: 'Europe/London', ...(p.injuryLevel ? { injuryLevel: p.injuryLevel } : {}), ...(p.adRisk ? { adRisk: p.adRisk } : {}) });
  if (p.baseline !== null) expect((await therapist.json('PATCH', `/api/clients/${body.id}`, { baselineSystolic: p.baseline })).status).toBe(200);
  return body.id as string;
}

async function check(clientId: string, body: object) {
  const therapist = await world.as('therapist');
  const res = await therapist.json('POST', `/api/clients/${clientId}/checks`, body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.evaluation as { showSafetyPanel: boolean; conditions: { kind: string; severity: string; reason: string }[] };
}

const liveFlags = async (clientId: string) => {
  const therapist = await world.as('therapist');
  return (await therapist.json('GET', `/api/clients/${clientId}/flags`)).body.flags.filter((f: { state: string }) => f.state === 'open' || f.state === 'acknowledged');
};

describe('blood pressure rise (autonomic dysreflexia)', () => {
  // source: Consortium for Spinal Cord Medicine clinical practice guideline on
  // autonomic dysreflexia, and the International Standards for Autonomic Function
  // after SCI: a systolic rise of more than 20 mmHg above baseline, mainly in
  // injuries at T6 and above.
  it('baseline 100, level T4: 121 raises an urgent bp_rise and the safety panel; 120 does not', async () => {
    const id = await clientWith({ injuryLevel: 'T4', baseline: 100 });
    const at120 = await check(id, { bpBefore: { systolic: 100, diastolic: 65 }, bpAfter: { systolic: 120, diastolic: 80 } });
    expect(at120).toMatchObject({ showSafetyPanel: false, conditions: [] });
    expect(await liveFlags(id)).toEqual([]);
    const at121 = await check(id, { bpBefore: { systolic: 100, diastolic: 65 }, bpAfter: { systolic: 121, diastolic: 80 } });
    expect(at121.showSafetyPanel).toBe(true);
    expect(at121.conditions.map((c) => [c.kind, c.severity])).toEqual([['bp_rise', 'urgent']]);
    const flags = await liveFlags(id);
    expect(flags.map((f: { kind: string; severity: string }) => [f.kind, f.severity])).toEqual([['bp_rise', 'urgent']]);
  });

  it('a client not at risk gets a review flag and no safety panel for the same rise', async () => {
    const id = await clientWith({ injuryLevel: 'L1', adRisk: 'not_at_risk', baseline: 100 });
    const e = await check(id, { bpAfter: { systolic: 125, diastolic: 80 } });
    expect(e.showSafetyPanel).toBe(false);
    expect(e.conditions.map((c) => [c.kind, c.severity])).toEqual([['bp_rise', 'review']]);
  });

  it('an autonomic-dysreflexia symptom alone shows the panel and raises an urgent flag', async () => {
    const id = await clientWith({ injuryLevel: 'C6', baseline: null });
    const e = await check(id, { adSymptoms: ['pounding_headache'] });
    expect(e.showSafetyPanel).toBe(true);
    expect(e.conditions.map((c) => [c.kind, c.severity])).toEqual([['bp_rise', 'urgent']]);
  });

  it('without a therapist baseline, the median of earlier pre-ride readings is used', async () => {
    const id = await clientWith({ injuryLevel: 'T2', baseline: null });
    for (const s of [104, 110, 108]) await check(id, { bpBefore: { systolic: s, diastolic: 70 } });
    // median 108: 129 is 21 above it
    const e = await check(id, { bpBefore: { systolic: 110, diastolic: 70 }, bpAfter: { systolic: 129, diastolic: 85 } });
    expect(e.conditions.map((c) => c.kind)).toEqual(['bp_rise']);
  });

  it('e-mails the client’s therapists at once, and no one else', async () => {
    const id = await clientWith({ injuryLevel: 'T4', baseline: 100 });
    await check(id, { bpAfter: { systolic: 140, diastolic: 90 } });
    const [flag] = await liveFlags(id);
    // The alert is queued before the answer comes back: the outbox rows for this flag are all the e-mails it makes.
    const queued = await world.knex('outbox_emails').where('dedupe_key', 'like', `urgent:${flag.id}:%`).select('to_address');
    expect(queued.map((q: { to_address: string }) => q.to_address)).toEqual([world.users.therapist.email]);
    const mail = await waitForMail(world.users.therapist.email, (m) => m.subject.startsWith('Urgent') && m.text.includes(flag.reason));
    expect(mail.text).toContain('autonomic dysreflexia');
    expect(mail.headers['list-unsubscribe']).toMatch(/\/unsubscribe\//);
  });
});

describe('blood pressure fall after riding (possible post-exercise hypotension)', () => {
  // source: consensus definition of orthostatic hypotension — a fall of at least
  // 20 mmHg systolic or 10 mmHg diastolic within 3 minutes of becoming upright.
  it.each([
    [{ systolic: 110, diastolic: 70 }, { systolic: 89, diastolic: 65 }, true],
    [{ systolic: 110, diastolic: 70 }, { systolic: 100, diastolic: 59 }, true],
    [{ systolic: 110, diastolic: 70 }, { systolic: 90, diastolic: 60 }, true],
    [{ systolic: 110, diastolic: 70 }, { systolic: 91, diastolic: 61 }, false],
  ])('%o → %o raises bp_drop: %s', async (before, after, raises) => {
    const id = await clientWith({ injuryLevel: 'L2', adRisk: 'not_at_risk', baseline: 110 });
    const e = await check(id, { bpBefore: before, bpAfter: after, bpAfterMinutes: 2 });
    expect(e.conditions.filter((c) => c.kind === 'bp_drop').map((c) => c.severity)).toEqual(raises ? ['review'] : []);
  });
});

describe('skin at the electrode sites', () => {
  it('redness that persists raises skin_concern for review; redness that fades does not', async () => {
    const id = await clientWith({ baseline: null });
    expect((await check(id, { skin: [{ site: 'quadriceps_left', state: 'redness_fades_30min' }] })).conditions).toEqual([]);
    const e = await check(id, { skin: [{ site: 'quadriceps_left', state: 'redness_persists' }, { site: 'gluteals_right', state: 'broken_skin' }] });
    expect(e.conditions.map((c) => [c.kind, c.severity])).toEqual([['skin_concern', 'review']]);
  });
});

describe('validation', () => {
  it('refuses an impossible reading with a message that names the field', async () => {
    const therapist = await world.as('therapist');
    const res = await therapist.json('POST', `/api/clients/${world.clientId}/checks`, { bpBefore: { systolic: 70, diastolic: 90 } });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/higher than diastolic/);
  });
});
