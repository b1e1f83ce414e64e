// Adherence from stored weeks must answer exactly what computeAdherence
// answers from the whole history, at the moment the weeks were stored and at
// any later moment without new data: random programs (prescription changes,
// pauses, zones with odd offsets, short and missing sessions, idle weeks),
// stored at one moment and read weeks later, compared week by week with the
// canonical computation (tested on its own against hand-worked cases in
// adherence.test.ts).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeAdherence } from '../../../src/lib/adherence';
import { adherenceFromStored, storedWeeksFrom, StoredWeeksMissing, weeksToStore, type StoredWeek } from '../../../src/lib/adherence/stored';
import type { Pause, PrescriptionVersion } from '../../../src/lib/adherence';
import { at, mondayWednesdayFriday, plusDays, ride, type DemoSession } from './fixtures';

const START = '2026-03-02'; // a Monday
const WEEKS = 30;
const zoneArb = fc.constantFrom('Europe/London', 'Asia/Kathmandu', 'America/Los_Angeles', 'Australia/Adelaide', 'Pacific/Chatham');

interface Program {
  zone: string;
  sessions: DemoSession[];
  prescriptions: PrescriptionVersion[];
  pauses: Pause[];
  threshold: number;
  storedAt: string;
  readAt: string[];
}

const programArb: fc.Arbitrary<Program> = fc
  .record({
    zone: zoneArb,
    days: fc.array(fc.record({ rides: fc.integer({ min: 0, max: 9 }), hour: fc.integer({ min: 0, max: 23 }), minutes: fc.constantFrom(30, 30, 40, 22, 12) }), {
      minLength: WEEKS * 7,
      maxLength: WEEKS * 7,
    }),
    // Whole weeks without a ride, so that streaks break and restart.
    idleWeeks: fc.array(fc.integer({ min: 0, max: WEEKS - 1 }), { maxLength: 6 }),
    startDay: fc.integer({ min: 0, max: 20 }),
    versions: fc.array(fc.record({ day: fc.integer({ min: 1, max: WEEKS * 7 + 40 }), sessionsPerWeek: fc.constantFrom(0, 2, 3, 5), minutes: fc.constantFrom(20, 30, 45) }), { maxLength: 3 }),
    pauses: fc.array(fc.record({ from: fc.integer({ min: 0, max: WEEKS * 7 + 40 }), length: fc.integer({ min: 1, max: 40 }), cancelled: fc.boolean() }), { maxLength: 3 }),
    threshold: fc.constantFrom(80, 80, 60, 100),
    // Stored some day of the program (or before it starts), read up to 40 weeks later.
    storedDay: fc.integer({ min: -10, max: WEEKS * 7 + 5 }),
    storedHour: fc.integer({ min: 0, max: 23 }),
    laterHours: fc.array(fc.integer({ min: 0, max: 40 * 7 * 24 }), { minLength: 1, maxLength: 4 }),
  })
  .map((p) => {
    const idle = new Set(p.idleWeeks);
    const sessions = p.days.flatMap((d, i): DemoSession[] =>
      d.rides >= 5 && !idle.has(Math.floor(i / 7)) ? [ride(plusDays(START, i), p.zone, { time: `${String(d.hour).padStart(2, '0')}:15`, minutes: d.minutes })] : [],
    );
    const prescriptions = [
      { effectiveFrom: plusDays(START, p.startDay), sessionsPerWeek: 3, minutesPerSession: 30 },
      ...p.versions
        .filter((v) => v.day > p.startDay)
        .sort((a, b) => a.day - b.day)
        .map((v) => ({ effectiveFrom: plusDays(START, v.day), sessionsPerWeek: v.sessionsPerWeek, minutesPerSession: v.minutes })),
    ];
    const pauses = p.pauses.filter((x) => !x.cancelled).map((x) => ({ from: plusDays(START, x.from), to: plusDays(START, x.from + x.length - 1) }));
    const storedMs = Date.parse(at(plusDays(START, p.storedDay), `${String(p.storedHour).padStart(2, '0')}:40`, p.zone));
    // Only the sessions in by then: a later one would have made the store stale.
    const inBy = sessions.filter((s) => Date.parse(s.startedAt) <= storedMs);
    return {
      zone: p.zone,
      sessions: inBy,
      prescriptions,
      pauses,
      threshold: p.threshold,
      storedAt: new Date(storedMs).toISOString(),
      readAt: [new Date(storedMs).toISOString(), ...p.laterHours.map((h) => new Date(storedMs + h * 3_600_000).toISOString())],
    };
  });

const byMonday = (weeks: StoredWeek[]) => new Map(weeks.map((w) => [w.monday, w]));

/** What the store does: read the window, and everything when a week outside it was needed. */
function readStored(p: Program, stored: ReturnType<typeof weeksToStore>, now: string, weeks: number) {
  const from = storedWeeksFrom(now, p.zone, weeks);
  const windowed = stored.weeks.filter((w) => w.monday >= from || w.monday === stored.through);
  const input = { timeZone: p.zone, prescriptions: p.prescriptions, pauses: p.pauses, countThresholdPct: p.threshold, now, weeks };
  try {
    return adherenceFromStored({ ...input, stored: { first: stored.first, through: stored.through, weeks: byMonday(windowed) } });
  } catch (err) {
    if (!(err instanceof StoredWeeksMissing)) throw err;
    return adherenceFromStored({ ...input, stored: { first: stored.first, through: stored.through, weeks: byMonday(stored.weeks) } });
  }
}

describe('adherence from stored weeks', () => {
  it('equals computeAdherence over the whole history, when stored and at any later moment', { timeout: 120_000 }, () => {
    fc.assert(
      fc.property(programArb, fc.constantFrom(1, 4, 12, 26), (p, weeks) => {
        const stored = weeksToStore({ timeZone: p.zone, prescriptions: p.prescriptions, pauses: p.pauses, countThresholdPct: p.threshold, sessions: p.sessions, now: p.storedAt });
        for (const now of p.readAt) {
          const expected = computeAdherence({ timeZone: p.zone, now, prescriptions: p.prescriptions, pauses: p.pauses, sessions: p.sessions, countThresholdPct: p.threshold, weeks });
          expect(readStored(p, stored, now, weeks)).toEqual(expected);
        }
      }),
      { numRuns: 300 },
    );
  });

  it('a streak carried past the last stored week ends in the first week without rides', () => {
    // Hand-worked: Mon/Wed/Fri for six weeks from 2026-03-02 (weeks 10–15 of
    // 2026), three a week prescribed; stored on the Saturday of the sixth
    // week. On the Wednesday of week 17 the sixth week is still met and
    // counted, week 16 had no ride: the streak is 0 and four weeks back
    // from week 16 hold 0 + 3 + 3 + 3 of 12 = 75 %.
    const zone = 'Europe/London';
    const prescriptions = [{ effectiveFrom: START, sessionsPerWeek: 3, minutesPerSession: 30 }];
    const sessions = mondayWednesdayFriday(START, 6, zone);
    const stored = weeksToStore({ timeZone: zone, prescriptions, pauses: [], sessions, now: at('2026-04-11', '12:00', zone) });
    expect(stored.first).toBe(START);
    expect(stored.through).toBe('2026-04-06');
    expect(stored.weeks.map((w) => w.run)).toEqual([1, 2, 3, 4, 5, 6]);
    const later = adherenceFromStored({ timeZone: zone, prescriptions, pauses: [], now: at('2026-04-22', '12:00', zone), weeks: 3, stored: { first: stored.first, through: stored.through, weeks: byMonday(stored.weeks) } });
    expect(later.streakWeeks).toBe(0);
    expect(later.adherence4wPct).toBe(75);
    expect(later.weeks.map((w) => [w.isoWeek, w.counted, w.met, w.finished])).toEqual([
      ['2026-W15', 3, true, true],
      ['2026-W16', 0, false, true],
      ['2026-W17', 0, false, false],
    ]);
  });

  it('asks for the stored weeks it was not given', () => {
    const zone = 'Europe/London';
    const prescriptions = [{ effectiveFrom: START, sessionsPerWeek: 3, minutesPerSession: 30 }];
    const stored = weeksToStore({ timeZone: zone, prescriptions, pauses: [], sessions: mondayWednesdayFriday(START, 10, zone), now: at('2026-05-13', '12:00', zone) });
    expect(() =>
      adherenceFromStored({ timeZone: zone, prescriptions, pauses: [], now: at('2026-05-13', '12:00', zone), stored: { first: stored.first, through: stored.through, weeks: new Map() } }),
    ).toThrow(StoredWeeksMissing);
  });
});
