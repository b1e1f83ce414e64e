// The scale benchmark's invented population: what its plan promises holds
// for every client and session (checked with luxon and plain date arithmetic
// here, not with the planner's own helpers).
import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import { clientSessions, planPopulation, type PlannedClient, type PlannedSession } from '../../../scripts/lib/scale/population';

const now = new Date('2026-11-18T15:00:00Z'); // a Wednesday
const options = { clients: 40, years: 1, otherClinics: 2, seed: 7, now };
const population = planPopulation(options, null);
const sessionsOf = new Map<PlannedClient, PlannedSession[]>(population.clients.map((c) => [c, clientSessions(c, now)]));
const localDay = (iso: string, zone: string) => DateTime.fromISO(iso, { setZone: true }).setZone(zone).toISODate()!;
const endMs = (s: PlannedSession) => Date.parse(s.spec.startedAt) + (s.spec.warmupMin + s.spec.activeMin + s.spec.cooldownMin) * 60_000;

describe('the scale population', () => {
  it('has the clinics, therapists and clients asked for', () => {
    // 40 clients in the main clinic, 40 / 20 = 2 in each of two more; 25 clients per therapist, rounded up.
    expect(population.clinics.map((c) => [c.clients, c.therapists.length])).toEqual([[40, 2], [2, 1], [2, 1]]);
    expect(population.clients).toHaveLength(44);
    expect(new Set(population.clients.map((c) => c.name)).size).toBe(44);
    expect(new Set(population.clients.map((c) => c.timeZone)).size).toBeGreaterThan(2);
  });

  it('comes out the same for the same seed and differently for another', () => {
    const again = planPopulation(options, null);
    expect(again.clients.map((c) => [c.name, c.programStart, clientSessions(c, now).length])).toEqual(population.clients.map((c) => [c.name, c.programStart, sessionsOf.get(c)!.length]));
    expect(planPopulation({ ...options, seed: 8 }, null).clients.map((c) => c.name)).not.toEqual(population.clients.map((c) => c.name));
  });

  it('rides only within the program, outside pauses, finished before now, on the local date it names', () => {
    for (const [c, sessions] of sessionsOf) {
      for (const s of sessions) {
        expect(localDay(s.spec.startedAt, c.timeZone), c.name).toBe(s.date);
        expect(s.date >= c.programStart, c.name).toBe(true);
        expect(endMs(s)).toBeLessThanOrEqual(now.getTime());
        expect(c.pauses.some((p) => s.date >= p.from && s.date <= p.to), `${c.name} ${s.date}`).toBe(false);
        if (c.archivedOn) expect(s.date <= c.archivedOn).toBe(true);
      }
    }
  });

  it('rides mostly on the prescribed weekdays, about as often as prescribed', () => {
    let onPlan = 0;
    let total = 0;
    for (const [c, sessions] of sessionsOf) {
      for (const s of sessions) {
        const version = c.versions.filter((v) => v.effectiveFrom <= s.date).at(-1)!;
        if (version.weekdays.includes(DateTime.fromISO(s.date).weekday)) onPlan++;
        total++;
      }
    }
    expect(onPlan / total).toBeGreaterThan(0.95);
    // A year at 2–5 sessions a week, less skips and pauses: roughly 100–250 a client.
    expect(total / population.clients.length).toBeGreaterThan(80);
    expect(total / population.clients.length).toBeLessThan(260);
  });

  it('ends each story as planned: a gap for those who stopped, an empty last week for those who missed it', () => {
    for (const [c, sessions] of sessionsOf) {
      const today = DateTime.fromJSDate(now).setZone(c.timeZone);
      if (c.story === 'stopped') expect(sessions.every((s) => s.date < today.minus({ days: 8 }).toISODate()!), c.name).toBe(true);
      if (c.story === 'missed_week') {
        const monday = today.startOf('week').minus({ weeks: 1 }).toISODate()!;
        const sunday = today.startOf('week').minus({ days: 1 }).toISODate()!;
        expect(sessions.some((s) => s.date >= monday && s.date <= sunday), c.name).toBe(false);
      }
    }
  });
});
