// Scenario tests: each builds a client's history through the real ingest path
// (uploads → parse jobs → sessions) and asserts the exact flags, weeks and
// streak that the therapist would see.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { evaluate, flagsOf, live, mondayOf, newClient, ride, steadyWeek, type RidePlan } from '../support/scenario';
import { createWorld, type World } from '../support/world';

let world: World;
beforeAll(async () => {
  world = await createWorld('supervision');
});
afterAll(closeDb);

const weeks = (from: number, to: number, extra: Partial<RidePlan> = {}) => {
  const out: RidePlan[] = [];
  for (let w = from; w >= to; w--) out.push(...steadyWeek(w, extra));
  return out;
};

async function adherenceOf(clientId: string) {
  const therapist = await world.as('therapist');
  return (await therapist.json('GET', `/api/clients/${clientId}/adherence?weeks=10`)).body;
}

// Lower power with the same stimulation would also be a rise in current per
// watt; the drop scenarios lower the current with the power to isolate the rule.
describe('supervision scenarios', () => {
  it('steady adherence raises no flag; every finished week is met and the streak counts them', async () => {
    const id = await newClient(world, 8);
    await ride(await world.as('therapist'), id, weeks(8, 1));
    expect(live(await evaluate(world, id))).toEqual([]);
    const a = await adherenceOf(id);
    expect(a.streakWeeks).toBe(8);
    expect(a.adherence4wPct).toBe(100);
    const lastWeek = a.weeks[a.weeks.length - 2];
    expect(lastWeek).toMatchObject({ isoWeek: mondayOf(1).toFormat("kkkk-'W'WW"), prescribed: 3, counted: 3, short: 0, met: true, paused: false });
  });

  it('a missed week raises one review flag that says so, and breaks the streak', async () => {
    const id = await newClient(world, 6);
    await ride(await world.as('therapist'), id, [...weeks(6, 2), { weeksAgo: 1, day: 1 }]);
    const flags = live(await evaluate(world, id));
    expect(flags.map((f) => [f.kind, f.severity])).toEqual([['missed_sessions', 'review']]);
    expect(flags[0].evidence).toMatchObject({ rule: 'missed_week', prescribed: 3, counted: 1 });
    expect(flags[0].reason).toMatch(/1 of the 3 prescribed sessions/);
    const a = await adherenceOf(id);
    expect(a.streakWeeks).toBe(0);
    expect(a.adherence4wPct).toBe(Math.round((100 * (3 + 3 + 3 + 1)) / 12));
  });

  it('a paused week raises no flag and leaves the streak unbroken', async () => {
    const id = await newClient(world, 6);
    const therapist = await world.as('therapist');
    const monday = mondayOf(1);
    expect((await therapist.json('POST', `/api/clients/${id}/pauses`, { from: monday.toISODate(), to: monday.plus({ days: 6 }).toISODate(), reason: 'Hospital stay' })).status).toBe(201);
    await ride(therapist, id, weeks(6, 2));
    expect(live(await evaluate(world, id))).toEqual([]);
    const a = await adherenceOf(id);
    expect(a.weeks[a.weeks.length - 2]).toMatchObject({ paused: true, met: false, prescribed: 0 });
    expect(a.streakWeeks).toBe(5);
  });

  it('power 25 % below the usual level in both latest sessions is a review flag; 40 % is urgent', async () => {
    const review = await newClient(world, 4);
    const urgent = await newClient(world, 4);
    const therapist = await world.as('therapist');
    await ride(therapist, review, [...weeks(4, 2), { weeksAgo: 1, day: 0 }, { weeksAgo: 1, day: 2, powerW: 15, currentMa: 45 }, { weeksAgo: 1, day: 4, powerW: 15, currentMa: 45 }]);
    await ride(therapist, urgent, [...weeks(4, 2), { weeksAgo: 1, day: 0 }, { weeksAgo: 1, day: 2, powerW: 12, currentMa: 36 }, { weeksAgo: 1, day: 4, powerW: 12, currentMa: 36 }]);
    const r = live(await evaluate(world, review));
    expect(r.map((f) => [f.kind, f.severity])).toEqual([['power_drop', 'review']]);
    expect(r[0].evidence).toMatchObject({ baseline: 20 });
    expect(r[0].reason).toMatch(/25 %/);
    const u = live(await evaluate(world, urgent));
    expect(u.map((f) => [f.kind, f.severity])).toEqual([['power_drop', 'urgent']]);
    expect(u[0].reason).toMatch(/40 %/);
  });

  it('a single bad session raises nothing', async () => {
    const id = await newClient(world, 4);
    await ride(await world.as('therapist'), id, [...weeks(4, 2), { weeksAgo: 1, day: 0 }, { weeksAgo: 1, day: 2 }, { weeksAgo: 1, day: 4, powerW: 10, currentMa: 30 }]);
    expect(live(await evaluate(world, id))).toEqual([]);
  });

  it('more current for the same power in both latest sessions raises current_rise for review', async () => {
    const id = await newClient(world, 4);
    // 60 + 62 mA at 20 W is 6.1 mA/W; 80 + 82 mA is 8.1 mA/W, 33 % more.
    await ride(await world.as('therapist'), id, [...weeks(4, 2), { weeksAgo: 1, day: 0 }, { weeksAgo: 1, day: 2, currentMa: 80 }, { weeksAgo: 1, day: 4, currentMa: 80 }]);
    const flags = live(await evaluate(world, id));
    expect(flags.map((f) => [f.kind, f.severity])).toEqual([['current_rise', 'review']]);
  });

  it('two of the last three sessions short raises short_session (info)', async () => {
    const id = await newClient(world, 4);
    await ride(await world.as('therapist'), id, [
      ...weeks(4, 2),
      { weeksAgo: 1, day: 0 },
      { weeksAgo: 1, day: 1 },
      { weeksAgo: 1, day: 2, minutes: 15 },
      { weeksAgo: 1, day: 3 },
      { weeksAgo: 1, day: 4, minutes: 15 },
    ]);
    const flags = live(await evaluate(world, id));
    expect(flags.map((f) => [f.kind, f.severity])).toEqual([['short_session', 'info']]);
    expect((await adherenceOf(id)).weeks.at(-2)).toMatchObject({ counted: 3, short: 2, met: true });
  });

  it('an acknowledged power drop followed by a deeper drop updates and reopens the same flag', async () => {
    const id = await newClient(world, 5);
    const therapist = await world.as('therapist');
    await ride(therapist, id, [...weeks(5, 3), { weeksAgo: 2, day: 0 }, { weeksAgo: 2, day: 2, powerW: 15, currentMa: 45 }, { weeksAgo: 2, day: 4, powerW: 15, currentMa: 45 }]);
    const [first] = live(await evaluate(world, id));
    expect(first).toMatchObject({ kind: 'power_drop', severity: 'review' });
    expect((await therapist.json('POST', `/api/flags/${first.id}`, { action: 'acknowledge', note: 'Electrodes replaced' })).status).toBe(200);
    expect(live(await flagsOf(world, id))[0].state).toBe('acknowledged');

    await ride(therapist, id, [{ weeksAgo: 1, day: 0, powerW: 11, currentMa: 33 }, { weeksAgo: 1, day: 2, powerW: 11, currentMa: 33 }, { weeksAgo: 1, day: 4, powerW: 11, currentMa: 33 }]);
    const after = await evaluate(world, id);
    const drops = after.filter((f) => f.kind === 'power_drop');
    expect(drops).toHaveLength(1);
    expect(drops[0]).toMatchObject({ id: first.id, state: 'open', severity: 'urgent' });
    expect(drops[0].history.map((h) => h.action)).toEqual(['raised', 'acknowledged', 'reopened']);
    expect(drops[0].history[1].note).toBe('Electrodes replaced');
  });

  it('a late file that fills the “missed” week withdraws the flag and says why', async () => {
    const id = await newClient(world, 4);
    const therapist = await world.as('therapist');
    await ride(therapist, id, [...weeks(4, 2), { weeksAgo: 1, day: 0 }, { weeksAgo: 1, day: 2 }]);
    const [missed] = live(await evaluate(world, id));
    expect(missed.kind).toBe('missed_sessions');
    await ride(therapist, id, [{ weeksAgo: 1, day: 4 }]);
    const flag = (await evaluate(world, id)).find((f) => f.id === missed.id)!;
    expect(flag.state).toBe('withdrawn');
    const withdrawn = flag.history.at(-1)!;
    expect(withdrawn.action).toBe('withdrawn');
    expect(live(await flagsOf(world, id))).toEqual([]);
  });

  it('the worker evaluates flags by itself after a batch arrives', async () => {
    const id = await newClient(world, 4);
    await ride(await world.as('therapist'), id, [...weeks(4, 2), { weeksAgo: 1, day: 0 }, { weeksAgo: 1, day: 2, powerW: 12, currentMa: 36 }, { weeksAgo: 1, day: 4, powerW: 12, currentMa: 36 }]);
    // Saving the prescription alone was judged too (no sessions yet: missed); the batch settles that.
    const deadline = Date.now() + 30_000;
    let kinds = live(await flagsOf(world, id)).map((f) => f.kind);
    while (kinds.join() !== 'power_drop' && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 500));
      kinds = live(await flagsOf(world, id)).map((f) => f.kind);
    }
    expect(kinds).toEqual(['power_drop']);
  });
});

describe('triage', () => {
  it('lists the clinic’s flagged clients, most severe first, and an acknowledged flag leaves the list', async () => {
    const therapist = await world.as('therapist');
    const triage = await therapist.json('GET', '/api/triage');
    expect(triage.status).toBe(200);
    const mine = triage.body.filter((r: { clientName: string }) => r.clientName.includes(world.tag));
    expect(mine.length).toBeGreaterThan(0);
    const ranks = mine.map((r: { flags: { severity: string }[] }) => ['urgent', 'review', 'info'].indexOf(r.flags[0].severity));
    expect([...ranks].sort()).toEqual(ranks);
    for (const row of mine) expect(row).toEqual(expect.objectContaining({ lastSessionAt: expect.any(String), streakWeeks: expect.any(Number) }));
    const target = mine[0];
    await therapist.json('POST', `/api/flags/${target.flags[0].id}`, { action: 'acknowledge' });
    const again = await therapist.json('GET', '/api/triage');
    const still = again.body.find((r: { clientId: string }) => r.clientId === target.clientId);
    expect(still?.flags.map((f: { id: string }) => f.id) ?? []).not.toContain(target.flags[0].id);
    const other = await world.as('otherTherapist');
    const theirs = await other.json('GET', '/api/triage');
    expect(theirs.body.some((r: { clientName: string }) => r.clientName.includes(world.tag))).toBe(false);
  });
});
