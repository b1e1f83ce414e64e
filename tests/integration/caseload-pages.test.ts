// Triage and the caseload a page at a time, searched, filtered and ordered by
// the server over the whole list; and the figures read from the stored weeks
// equal the figures read from the whole history, for a client with real
// sessions, whichever of the two the read takes.
import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { refreshAdherence } from '../../src/lib/supervision/adherence-store';
import { mondayOf, newClient, ride, steadyWeek, ZONE } from '../support/scenario';
import { Http } from '../support/http';
import { createWorld, PASSWORD, type World } from '../support/world';

let world: World;

interface Row {
  clientId: string;
  clientName: string;
  flags: { id: string; kind: string; severity: string }[];
  lastSessionAt: string | null;
  adherence4wPct: number | null;
  streakWeeks: number;
  powerTrendWPerWeek: number | null;
}
interface Page {
  clients: Row[];
  total: number;
  offset: number;
  limit: number;
  nextOffset: number | null;
  all: { clients: number; flags: number; byKind: Record<string, number>; bySeverity: Record<string, number> };
}

beforeAll(async () => {
  world = await createWorld('pages');
});

describe('triage and the caseload, a page at a time', () => {
  it('pages through the same order, filters and counts over the whole list, and audits only the page shown', { timeout: 60_000 }, async () => {
    // A clinic of its own, so the totals are this test's: six clients, five with flags.
    const [clinic] = await world.knex('clinics').insert({ name: `Paging ${world.tag}`, time_zone: 'Europe/London' }).returning('id');
    const hash = (await world.knex('users').where({ id: world.users.therapist.id }).first('password_hash')).password_hash;
    const [staff] = await world.knex('users').insert({ email: `paging.${world.tag}@example.test`, name: 'Page Turner', password_hash: hash }).returning('id');
    await world.knex('memberships').insert({ user_id: staff.id, clinic_id: clinic.id, role: 'therapist' });
    const names = ['Ada Birch', 'Ben Cedar', 'Cleo Dunn', 'Dara Elm', 'Eli Fern', 'Fay Gale'];
    const ids: Record<string, string> = {};
    for (const name of names) {
      const [c] = await world.knex('clients').insert({ clinic_id: clinic.id, display_name: name, diagnosis: 'sci', time_zone: ZONE }).returning('id');
      ids[name] = c.id;
    }
    const raised = (daysAgo: number) => new Date(Date.now() - daysAgo * 86_400_000);
    const flag = (name: string, kind: string, severity: string, daysAgo: number) =>
      world.knex('flags').insert({ client_id: ids[name], clinic_id: clinic.id, kind, severity, state: 'open', anchor: randomUUID(), reason: `${kind} of ${name}`, evidence: '{}', raised_at: raised(daysAgo) });
    // Hand-ordered (PRODUCT.md, triage): a blood pressure rise of any severity first, then urgent,
    // review and info, the longest waiting first within each.
    await flag('Dara Elm', 'power_drop', 'urgent', 2);
    await flag('Ben Cedar', 'missed_sessions', 'urgent', 5);
    await flag('Ben Cedar', 'short_session', 'info', 1);
    await flag('Fay Gale', 'missed_sessions', 'review', 3);
    await flag('Ada Birch', 'current_rise', 'review', 1);
    await flag('Eli Fern', 'short_session', 'info', 9);
    await flag('Eli Fern', 'bp_rise', 'review', 0);
    const http = await new Http().signIn(`paging.${world.tag}@example.test`, PASSWORD);

    const pages: Page[] = [];
    for (let offset: number | null = 0; offset !== null; offset = pages.at(-1)!.nextOffset) pages.push((await http.json('GET', `/api/triage?limit=2&offset=${offset}`)).body);
    expect(pages.map((p) => p.clients.map((r) => r.clientName))).toEqual([['Eli Fern', 'Ben Cedar'], ['Dara Elm', 'Fay Gale'], ['Ada Birch']]);
    expect(pages.map((p) => [p.total, p.offset, p.nextOffset])).toEqual([[5, 0, 2], [5, 2, 4], [5, 4, null]]);
    expect(pages[0].all).toEqual({ clients: 5, flags: 7, byKind: { power_drop: 1, missed_sessions: 2, short_session: 2, current_rise: 1, bp_rise: 1 }, bySeverity: { urgent: 2, info: 2, review: 3 } });
    // A client's own flags, most urgent first.
    expect(pages[0].clients[0].flags.map((f) => f.kind)).toEqual(['bp_rise', 'short_session']);
    expect(pages[0].clients[1].flags.map((f) => f.severity)).toEqual(['urgent', 'info']);

    const info = (await http.json('GET', '/api/triage?severity=info')).body as Page;
    expect(info.clients.map((r) => [r.clientName, r.flags.map((f) => f.kind)])).toEqual([['Eli Fern', ['short_session']], ['Ben Cedar', ['short_session']]]);
    expect(info.total).toBe(2);
    expect(info.all.clients).toBe(5);
    const missed = (await http.json('GET', '/api/triage?kind=missed_sessions&q=CEDAR')).body as Page;
    expect(missed.clients.map((r) => [r.clientName, r.flags.map((f) => f.kind)])).toEqual([['Ben Cedar', ['missed_sessions']]]);
    // Every word of the search, in any order and case, within the name.
    const words = async (q: string) => ((await http.json('GET', `/api/caseload?q=${encodeURIComponent(q)}`)).body as Page).clients.map((r) => r.clientName);
    expect(await words('  cedar   BEN ')).toEqual(['Ben Cedar']);
    expect(await words('e')).toEqual(['Ben Cedar', 'Cleo Dunn', 'Dara Elm', 'Eli Fern', 'Fay Gale']);
    expect(await words('cedar elm')).toEqual([]);
    expect(await words('%')).toEqual([]);

    const byName = (await http.json('GET', '/api/caseload?limit=4')).body as Page;
    expect(byName.clients.map((r) => r.clientName)).toEqual(['Ada Birch', 'Ben Cedar', 'Cleo Dunn', 'Dara Elm']);
    expect([byName.total, byName.nextOffset]).toEqual([6, 4]);
    const backwards = (await http.json('GET', '/api/caseload?sort=client&desc=1&limit=2')).body as Page;
    expect(backwards.clients.map((r) => r.clientName)).toEqual(['Fay Gale', 'Eli Fern']);
    // Without a session nobody has a last one: ordered by name among themselves.
    const bySession = (await http.json('GET', '/api/caseload?sort=lastSession&limit=3')).body as Page;
    expect(bySession.clients.map((r) => r.clientName)).toEqual(['Ada Birch', 'Ben Cedar', 'Cleo Dunn']);

    const audit = await world.knex('audit_log').where({ actor_user_id: staff.id, action: 'caseload.view' }).orderBy('id', 'desc').first();
    expect([...audit.detail.clientIds].sort()).toEqual([ids['Ada Birch'], ids['Ben Cedar'], ids['Cleo Dunn']].sort());

    for (const bad of ['limit=0', 'limit=201', 'offset=-1', 'kind=broken_leg', 'severity=low', 'sort=age', 'colour=red']) {
      const r = await http.json('GET', `/api/caseload?${bad}`);
      expect(r.status, bad).toBe(400);
      expect(r.body.error.code).toBe('invalid_input');
    }
  });
});

describe('figures from the stored weeks', () => {
  it('equal those from the whole history, stale or fresh, and follow a late file at once', { timeout: 90_000 }, async () => {
    const therapist = await world.as('therapist');
    const id = await newClient(world, 6);
    // Hand-worked: three counted rides in each of the five finished weeks but
    // the third before this one (two), none yet this week: the streak is the
    // two met weeks since the short one, the four finished weeks hold
    // 3 + 3 + 2 + 3 of 12 = 92 %.
    await ride(therapist, id, [...steadyWeek(5), ...steadyWeek(4), ...steadyWeek(3, { powerW: 21 }).slice(0, 2), ...steadyWeek(2, { powerW: 22 }), ...steadyWeek(1, { powerW: 23 })]);
    const name = (await therapist.json('GET', `/api/clients/${id}`)).body.name as string;
    const read = async () => {
      const row = ((await therapist.json('GET', `/api/caseload?q=${encodeURIComponent(name)}`)).body as Page).clients[0];
      const adherence = (await therapist.json('GET', `/api/clients/${id}/adherence?weeks=8`)).body;
      return { row, adherence };
    };

    await refreshAdherence(world.knex, id);
    const state = await world.knex('adherence_state').where({ client_id: id }).first();
    expect(state.source_seq).toBe(state.input_seq);
    const fresh = await read();
    expect(fresh.row.streakWeeks).toBe(2);
    expect(fresh.row.adherence4wPct).toBe(92);
    expect(fresh.row.lastSessionAt).toBe(mondayOf(1).plus({ days: 4, hours: 10 }).toUTC().toISO({ suppressMilliseconds: false }));
    expect(fresh.adherence.weeks.map((w: { counted: number }) => w.counted)).toEqual([0, 0, 3, 3, 2, 3, 3, 0]);

    // The same client read the old way: the store is marked out of date.
    await world.knex('adherence_state').where({ client_id: id }).increment('input_seq', 1);
    const stale = await read();
    expect(stale).toEqual(fresh);

    // A late file that fills the short week: the trigger marks the store stale
    // at once (the read takes the whole history) and the worker stores the
    // weeks again; either way the streak is five weeks.
    await ride(therapist, id, [{ weeksAgo: 3, day: 5 }]);
    const after = await read();
    expect(after.row.streakWeeks).toBe(5);
    expect(after.row.adherence4wPct).toBe(100);
    await refreshAdherence(world.knex, id);
    expect(await read()).toEqual(after);
  });
});
