import { DateTime } from 'luxon';
import { evaluateClientFlags } from '../../src/lib/supervision/flag-store';
import type { Http } from './http';
import { rideCsv, uploadAndWait } from './rides';
import type { World } from './world';

export const ZONE = 'Europe/London';

/** Monday of the ISO week `weeksAgo` weeks before the current one, in the client's zone. */
export function mondayOf(weeksAgo: number): DateTime {
  return DateTime.now().setZone(ZONE).startOf('week').minus({ weeks: weeksAgo });
}

export interface RidePlan {
  weeksAgo: number;
  /** 0 = Monday … 6 = Sunday */
  day: number;
  minutes?: number;
  powerW?: number;
  currentMa?: number;
}

/** The three weekday rides of a steady week. */
export const steadyWeek = (weeksAgo: number, extra: Partial<RidePlan> = {}): RidePlan[] => [0, 2, 4].map((day) => ({ weeksAgo, day, ...extra }));

/**
 * A client of the world's clinic with a prescription (3 × 30 min from
 * `weeksOfProgram` weeks ago), built through the API as the therapist does it.
 */
export async function newClient(world: World, weeksOfProgram = 10) {
  const therapist = await world.as('therapist');
  const created = await therapist.json('POST', '/api/clients', { name: `Scenario ${world.tag}-${Math.random().toString(36).slice(2, 7)}`, timezone: ZONE, diagnosis: 'sci', injuryLevel: 'T8' });
  if (created.status !== 201) throw new Error(`client not created: ${JSON.stringify(created.body)}`);
  const id: string = created.body.id;
  const rx = await therapist.json('PUT', `/api/clients/${id}/prescription`, { sessionsPerWeek: 3, minutesPerSession: 30, effectiveFrom: mondayOf(weeksOfProgram).toISODate(), notClearedReason: 'Scenario client without clearance' });
  if (rx.status !== 201) throw new Error(`prescription not saved: ${JSON.stringify(rx.body)}`);
  return id;
}

/** Uploads the planned rides through the real ingest path, in the order given, and waits for each to be a session. */
export async function ride(http: Http, clientId: string, plans: RidePlan[]) {
  const files = plans.map((p, i) => ({
    name: `w${p.weeksAgo}-d${p.day}-${i}.csv`,
    content: rideCsv({
      startedAt: mondayOf(p.weeksAgo).plus({ days: p.day, hours: 10 }).toUTC().toISO()!,
      minutes: p.minutes ?? 30,
      powerW: p.powerW ?? 20,
      currentMa: p.currentMa ?? 60,
    }),
  }));
  const results = [];
  for (let i = 0; i < files.length; i += 40) results.push(...(await uploadAndWait(http, clientId, files.slice(i, i + 40))));
  const bad = results.filter((r) => r.status !== 'accepted');
  if (bad.length) throw new Error(`rides not accepted: ${JSON.stringify(bad)}`);
  return results;
}

/** Runs the evaluation the worker runs after a batch, now, and returns the client's flags as the API shows them. */
export async function evaluate(world: World, clientId: string) {
  await evaluateClientFlags(world.knex, clientId);
  return flagsOf(world, clientId);
}

export async function flagsOf(world: World, clientId: string) {
  const therapist = await world.as('therapist');
  const res = await therapist.json('GET', `/api/clients/${clientId}/flags`);
  return res.body.flags as { id: string; kind: string; severity: string; state: string; reason: string; evidence: any; clearedAt: string | null; history: { action: string; note: string | null }[] }[];
}

export const live = (flags: Awaited<ReturnType<typeof flagsOf>>) => flags.filter((f) => f.state === 'open' || f.state === 'acknowledged');
