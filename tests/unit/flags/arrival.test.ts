// Flags depend on the data and the clock, never on when the files arrived: a
// client's history split into batches that reach Kinloop at random times
// (late, out of order, with the hourly sweep judging in between) ends with the
// same flags — kind, episode, severity, cleared or not — as the whole history
// arriving at once. Withdrawn flags (raised on a partial view, disproved by
// files that came later) are the only trace the batches may leave.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { applyFlagChanges, planFlagChanges, type ExistingFlag, type FlagInput } from '../../../src/lib/flags';
import { at, plusDays, ride, type DemoSession } from '../adherence/fixtures';

const START = '2026-08-03'; // a Monday
const WEEKS = 9;

/** One ride a day at most, on any of the program's days, with values that sometimes raise a flag (invented numbers). */
const dayArb = fc.record({
  rides: fc.boolean(),
  hour: fc.integer({ min: 7, max: 19 }),
  minutes: fc.constantFrom(30, 30, 30, 35, 18),
  power: fc.constantFrom(20, 20, 21, 19, 15, 11),
  currentPerWatt: fc.constantFrom(2.5, 2.5, 2.6, 3.4),
});

// Zones with whole, half and three-quarter hour offsets, north and south.
const zoneArb = fc.constantFrom('Europe/London', 'Asia/Kolkata', 'Asia/Kathmandu', 'America/Los_Angeles', 'Australia/Adelaide');

interface History {
  zone: string;
  sessions: DemoSession[];
  prescriptions: FlagInput['prescriptions'];
  pauses: FlagInput['pauses'];
  now: string;
}

const historyArb: fc.Arbitrary<History> = fc
  .record({
    zone: zoneArb,
    days: fc.array(dayArb, { minLength: WEEKS * 7, maxLength: WEEKS * 7 }),
    pause: fc.option(fc.record({ from: fc.integer({ min: 7, max: WEEKS * 7 - 10 }), length: fc.integer({ min: 1, max: 12 }) }), { nil: null }),
    secondVersion: fc.option(fc.record({ day: fc.integer({ min: 14, max: WEEKS * 7 - 7 }), sessionsPerWeek: fc.constantFrom(2, 3, 4), minutes: fc.constantFrom(30, 40) }), { nil: null }),
    // Now: some hour of the day after the history's last day.
    nowHour: fc.integer({ min: 0, max: 23 }),
    // Extra days without data before now: a gap may still be growing.
    idleDays: fc.integer({ min: 0, max: 14 }),
  })
  .map((h) => {
    const sessions = h.days.flatMap((d, i): DemoSession[] =>
      d.rides ? [ride(plusDays(START, i), h.zone, { time: `${String(d.hour).padStart(2, '0')}:00`, minutes: d.minutes, power: d.power, currentPerWatt: d.currentPerWatt })] : [],
    );
    const prescriptions = [
      { effectiveFrom: START, sessionsPerWeek: 3, minutesPerSession: 30 },
      ...(h.secondVersion ? [{ effectiveFrom: plusDays(START, h.secondVersion.day), sessionsPerWeek: h.secondVersion.sessionsPerWeek, minutesPerSession: h.secondVersion.minutes }] : []),
    ];
    const pauses = h.pause ? [{ from: plusDays(START, h.pause.from), to: plusDays(START, h.pause.from + h.pause.length - 1) }] : [];
    const now = at(plusDays(START, WEEKS * 7 + h.idleDays), `${String(h.nowHour).padStart(2, '0')}:30`, h.zone);
    return { zone: h.zone, sessions, prescriptions, pauses, now };
  });


/**
 * How the files reach Kinloop: each session goes into one of a few batches;
 * a batch arrives some time after its last ride ended (before now), and the
 * hourly sweep judges at a few other moments. A therapist may acknowledge
 * the open flags at any judgement.
 */
const arrivalArb = (h: History): fc.Arbitrary<Arrival> =>
  fc.record({
    batchOf: fc.array(fc.integer({ min: 0, max: 5 }), { minLength: h.sessions.length, maxLength: h.sessions.length }),
    delays: fc.array(fc.integer({ min: 1, max: 21 * 24 }), { minLength: 6, maxLength: 6 }),
    sweeps: fc.array(fc.integer({ min: 0, max: WEEKS * 7 * 24 }), { maxLength: 8 }),
    acknowledgeAt: fc.array(fc.boolean(), { minLength: 20, maxLength: 20 }),
  });

let ids = 0;
const newId = () => `f${++ids}`;

function input(h: History, sessions: DemoSession[], now: string): FlagInput {
  return { timeZone: h.zone, now, prescriptions: h.prescriptions, pauses: h.pauses, sessions };
}

function plan(flags: ExistingFlag[], h: History, sessions: DemoSession[], now: string): ExistingFlag[] {
  return applyFlagChanges(flags, planFlagChanges(flags, input(h, sessions, now)), now, newId);
}

/** What the therapist is shown: the live flags, each with its episode, severity and whether it has cleared. */
const shown = (flags: ExistingFlag[]) =>
  flags
    .filter((f) => f.state === 'open' || f.state === 'acknowledged')
    .map((f) => `${f.kind}|${f.anchor}|${f.severity}|${f.clearedAt === null ? 'holds' : 'cleared'}`)
    .sort();

type Arrival = { batchOf: number[]; delays: number[]; sweeps: number[]; acknowledgeAt: boolean[] };

function inBatches(h: History, a: Arrival): ExistingFlag[] {
  const nowMs = Date.parse(h.now);
  const endOf = (s: DemoSession) => Date.parse(s.startedAt) + s.durationS * 1000;
  const arrivals: { atMs: number; files: DemoSession[] }[] = [];
  for (let b = 0; b < 6; b++) {
    const files = h.sessions.filter((_, i) => a.batchOf[i] === b);
    if (!files.length) continue;
    const atMs = Math.min(nowMs, Math.max(...files.map(endOf)) + a.delays[b] * 3_600_000);
    arrivals.push({ atMs, files });
  }
  const startMs = Date.parse(at(START, '00:00', h.zone));
  const moments = [
    ...arrivals.map((x) => ({ atMs: x.atMs, files: x.files })),
    ...a.sweeps.map((hours) => ({ atMs: Math.min(nowMs, startMs + hours * 3_600_000), files: [] as DemoSession[] })),
    { atMs: nowMs, files: [] as DemoSession[] },
  ].sort((x, y) => x.atMs - y.atMs);
  let flags: ExistingFlag[] = [];
  const arrived: DemoSession[] = [];
  moments.forEach((m, i) => {
    arrived.push(...m.files);
    flags = plan(flags, h, arrived, new Date(m.atMs).toISOString());
    if (a.acknowledgeAt[i % a.acknowledgeAt.length]) flags = flags.map((f) => (f.state === 'open' ? { ...f, state: 'acknowledged' as const } : f));
  });
  return flags;
}

describe('flags and the arrival of files', () => {
  it(
    'end the same whether a history arrives in random late batches or all at once',
    () => {
      let withFlags = 0;
      let withCleared = 0;
      let runs = 0;
      fc.assert(
        fc.property(historyArb.chain((h) => fc.tuple(fc.constant(h), arrivalArb(h))), ([h, a]) => {
          const atOnce = shown(plan([], h, h.sessions, h.now));
          expect(shown(inBatches(h, a))).toEqual(atOnce);
          runs++;
          if (atOnce.length) withFlags++;
          if (atOnce.some((f) => f.endsWith('cleared'))) withCleared++;
        }),
        { numRuns: 120, seed: 20261202 },
      );
      // The histories must reach the interesting cases, not only steady riders.
      expect(withFlags / runs).toBeGreaterThan(0.5);
      expect(withCleared / runs).toBeGreaterThan(0.3);
    },
    120_000,
  );

  it('a short week then a met week leave the same cleared missed-week flag, uploaded week by week or in one late batch', () => {
    const zone = 'Europe/London';
    const h: History = {
      zone,
      prescriptions: [{ effectiveFrom: START, sessionsPerWeek: 3, minutesPerSession: 30 }],
      pauses: [],
      now: at('2026-08-24', '09:00', zone), // Monday of the fourth week
      // Week 1 (W32) met, week 2 (W33) one ride short, week 3 (W34) met.
      sessions: [0, 2, 4, 7, 9, 14, 16, 18].map((d) => ride(plusDays(START, d), zone)),
    };
    const weekly = [at('2026-08-10', '08:00', zone), at('2026-08-17', '08:00', zone), h.now].reduce(
      (flags, now) => plan(flags, h, h.sessions.filter((s) => s.startedAt < now), now),
      [] as ExistingFlag[],
    );
    // source: hand-worked — W33 (2026-08-10 to 2026-08-16) had 2 of 3 sessions, W34 had 3 of 3.
    expect(shown(weekly)).toEqual(['missed_sessions|2026-W33|review|cleared']);
    expect(shown(plan([], h, h.sessions, h.now))).toEqual(shown(weekly));
  });
});
