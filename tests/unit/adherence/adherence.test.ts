import { describe, expect, it } from 'vitest';
import { computeAdherence } from '../../../src/lib/adherence';
import type { AdherenceInput } from '../../../src/lib/adherence';
import { at, mondayWednesdayFriday, plusDays, ride } from './fixtures';

const ZONE = 'Europe/Berlin';
// Program starts Monday 2026-08-03 (2026-W32); the current week in most tests is
// 2026-W42 (Monday 2026-10-12), "now" being its Wednesday evening.
const START = '2026-08-03';
const CURRENT_MONDAY = '2026-10-12';
const NOW = at('2026-10-14', '20:00', ZONE);
const threePerWeek = [{ effectiveFrom: START, sessionsPerWeek: 3, minutesPerSession: 30 }];

function input(over: Partial<AdherenceInput>): AdherenceInput {
  return {
    timeZone: ZONE,
    now: NOW,
    prescriptions: threePerWeek,
    pauses: [],
    sessions: mondayWednesdayFriday(START, 10, ZONE),
    ...over,
  };
}

const week = (result: ReturnType<typeof computeAdherence>, key: string) => {
  const found = result.weeks.find((w) => w.isoWeek === key);
  if (!found) throw new Error(`week ${key} not in result`);
  return found;
};

describe('computeAdherence', () => {
  it('steady adherence: ten met weeks, the current week not yet met', () => {
    // Mon/Wed sessions of the current week are in, Friday is still to come.
    const sessions = [...mondayWednesdayFriday(START, 10, ZONE), ride(CURRENT_MONDAY, ZONE), ride('2026-10-14', ZONE)];
    const result = computeAdherence(input({ sessions }));
    expect(result.weeks).toHaveLength(12);
    expect(result.weeks.at(-1)).toEqual({
      isoWeek: '2026-W42',
      monday: CURRENT_MONDAY,
      prescribed: 3,
      counted: 2,
      short: 0,
      met: false,
      paused: false,
      finished: false,
      hasPrescription: true,
    });
    expect(result.weeks[0]).toMatchObject({ isoWeek: '2026-W31', hasPrescription: false, prescribed: 0, met: false, finished: true });
    expect(result.weeks.slice(1, 11).every((w) => w.met && w.finished && w.prescribed === 3 && w.counted === 3)).toBe(true);
    expect(result.streakWeeks).toBe(10);
    expect(result.adherence4wPct).toBe(100);
  });

  it('the current week adds one to the streak once it is met', () => {
    const sessions = [
      ...mondayWednesdayFriday(START, 10, ZONE),
      ride(CURRENT_MONDAY, ZONE),
      ride('2026-10-13', ZONE),
      ride('2026-10-14', ZONE, { time: '08:00' }),
    ];
    const result = computeAdherence(input({ sessions }));
    expect(week(result, '2026-W42')).toMatchObject({ met: true, finished: false, counted: 3 });
    expect(result.streakWeeks).toBe(11);
    // The unfinished week is not part of the four-week figure.
    expect(result.adherence4wPct).toBe(100);
  });

  it('a missed week breaks the streak', () => {
    // Week 2026-W37 (Monday 2026-09-07) has only two sessions.
    const sessions = mondayWednesdayFriday(START, 10, ZONE).filter((s) => s.id !== 's-2026-09-11-1000');
    const result = computeAdherence(input({ sessions }));
    expect(week(result, '2026-W37')).toMatchObject({ prescribed: 3, counted: 2, met: false, paused: false });
    expect(result.streakWeeks).toBe(4); // W38–W41
    expect(result.adherence4wPct).toBe(100); // W38–W41
  });

  it('a missed last finished week leaves a streak of 0 even though earlier weeks were met', () => {
    const sessions = mondayWednesdayFriday(START, 9, ZONE);
    const result = computeAdherence(input({ sessions }));
    expect(week(result, '2026-W41')).toMatchObject({ counted: 0, met: false });
    expect(result.streakWeeks).toBe(0);
    expect(result.adherence4wPct).toBe(75); // 3+3+3+0 of 12
  });

  it('a wholly paused week is skipped: neither met nor missed, the streak runs through it', () => {
    // Week 2026-W37 is paused Monday to Sunday, with no sessions.
    const sessions = mondayWednesdayFriday(START, 10, ZONE).filter((s) => !s.id.match(/2026-09-(07|09|11)/));
    const pauses = [{ from: '2026-09-07', to: '2026-09-13' }];
    const result = computeAdherence(input({ sessions, pauses }));
    expect(week(result, '2026-W37')).toMatchObject({ paused: true, prescribed: 0, counted: 0, met: false, hasPrescription: true });
    expect(result.streakWeeks).toBe(9);
  });

  it('a partly paused week is prorated by its unpaused days, rounded up, and is not met', () => {
    // Paused Wednesday to Sunday: two unpaused days, ceil(3 × 2 / 7) = 1.
    const sessions = mondayWednesdayFriday(START, 10, ZONE).filter((s) => !s.id.match(/2026-09-(09|11)/));
    const result = computeAdherence(input({ sessions, pauses: [{ from: '2026-09-09', to: '2026-09-13' }] }));
    expect(week(result, '2026-W37')).toMatchObject({ paused: true, prescribed: 1, counted: 1, met: false });
    expect(result.streakWeeks).toBe(9);

    // Paused Thursday to Saturday: four unpaused days, ceil(3 × 4 / 7) = 2.
    const other = computeAdherence(input({ pauses: [{ from: '2026-09-10', to: '2026-09-12' }] }));
    expect(week(other, '2026-W37')).toMatchObject({ paused: true, prescribed: 2, counted: 3, met: false });
    // A pause from Saturday to the next Thursday marks both weeks: 5 and 3 unpaused days.
    const spanning = computeAdherence(input({ pauses: [{ from: '2026-09-12', to: '2026-09-17' }] }));
    expect(week(spanning, '2026-W37')).toMatchObject({ paused: true, prescribed: 3 });
    expect(week(spanning, '2026-W38')).toMatchObject({ paused: true, prescribed: 2 });
  });

  it('the four-week figure skips paused weeks and reaches back past them', () => {
    const sessions = mondayWednesdayFriday(START, 10, ZONE).filter((s) => !s.id.match(/2026-08-(03|05)/));
    // W39–W41 paused: the last four judged weeks are W35–W38, all met.
    const result = computeAdherence(input({ sessions, pauses: [{ from: '2026-09-21', to: '2026-10-11' }] }));
    expect(result.adherence4wPct).toBe(100);
    // With W32–W41 all paused but W32, only W32 is judged: 1 of 3 → 33 %.
    const mostly = computeAdherence(input({ sessions, pauses: [{ from: '2026-08-10', to: '2026-10-11' }] }));
    expect(mostly.adherence4wPct).toBe(33);
  });

  it('a short session is not counted', () => {
    // 80 % of 30 min is 24 min = 1440 s: 1439 s is short, 1440 s counts.
    const sessions = mondayWednesdayFriday(START, 10, ZONE).map((s) =>
      s.id === 's-2026-10-09-1000' ? { ...s, durationS: 1439 } : s.id === 's-2026-10-07-1000' ? { ...s, durationS: 1440 } : s,
    );
    const result = computeAdherence(input({ sessions }));
    expect(week(result, '2026-W41')).toMatchObject({ counted: 2, short: 1, met: false });
    expect(result.streakWeeks).toBe(0);
    // A clinic threshold of 70 % (21 min) counts the 1439 s session.
    expect(computeAdherence(input({ sessions, countThresholdPct: 70 })).streakWeeks).toBe(10);
  });

  it('places a session near midnight in the week of its local start date', () => {
    // Week W41 gets its third session at 23:30 on Sunday 2026-10-11 in Berlin
    // (21:30 UTC; from memory: Berlin is on CEST, UTC+2, until 25 October 2026); Friday's session is dropped.
    const sessions = [
      ...mondayWednesdayFriday(START, 10, ZONE).filter((s) => s.id !== 's-2026-10-09-1000'),
      ride('2026-10-11', ZONE, { time: '23:30' }),
    ];
    const result = computeAdherence(input({ sessions }));
    expect(week(result, '2026-W41')).toMatchObject({ counted: 3, met: true });
    expect(week(result, '2026-W42')).toMatchObject({ counted: 0 });

    // In Sydney, 00:30 on Monday 2026-10-12 is Sunday 13:30 UTC (from memory: AEDT, UTC+11, from 4 October 2026): it belongs to W42.
    const sydney = 'Australia/Sydney';
    const sydneySessions = [
      ...mondayWednesdayFriday(START, 10, sydney).filter((s) => s.id !== 's-2026-10-09-1000'),
      ride('2026-10-12', sydney, { time: '00:30' }),
    ];
    expect(sydneySessions.at(-1)!.startedAt).toBe('2026-10-11T13:30:00.000Z');
    const inSydney = computeAdherence(input({ timeZone: sydney, sessions: sydneySessions, now: at('2026-10-14', '20:00', sydney) }));
    expect(week(inSydney, '2026-W41')).toMatchObject({ counted: 2, met: false });
    expect(week(inSydney, '2026-W42')).toMatchObject({ counted: 1 });
  });

  it('applies a prescription change: Sunday’s version sets the target, each session is judged by its own day’s version', () => {
    // From Thursday 2026-09-10 (in W37): 2 sessions of 45 minutes; 80 % is 36 min.
    const prescriptions = [
      ...threePerWeek,
      { effectiveFrom: '2026-09-10', sessionsPerWeek: 2, minutesPerSession: 45 },
    ];
    const sessions = [
      ...mondayWednesdayFriday(START, 5, ZONE), // W32–W36, 30 min
      ride('2026-09-07', ZONE, { minutes: 30 }), // W37 Monday, old version: counts
      ride('2026-09-11', ZONE, { minutes: 30 }), // W37 Friday, new version: short
      ...[0, 1, 2, 3].flatMap((w) => [
        ride(plusDays('2026-09-14', w * 7), ZONE, { minutes: 40 }),
        ride(plusDays('2026-09-17', w * 7), ZONE, { minutes: 40 }),
      ]), // W38–W41, two of 40 min
    ];
    const result = computeAdherence(input({ prescriptions, sessions }));
    expect(week(result, '2026-W37')).toMatchObject({ prescribed: 2, counted: 1, short: 1, met: false });
    expect(week(result, '2026-W38')).toMatchObject({ prescribed: 2, counted: 2, met: true });
    expect(week(result, '2026-W42')).toMatchObject({ prescribed: 2 });
    expect(result.streakWeeks).toBe(4);
  });

  it('does not count weeks before the first prescription and prorates the week it starts', () => {
    // Program starts Thursday 2026-09-10: W37 asks for ceil(3 × 4 / 7) = 2.
    const prescriptions = [{ effectiveFrom: '2026-09-10', sessionsPerWeek: 3, minutesPerSession: 30 }];
    const sessions = [
      ride('2026-09-08', ZONE), // before the program: neither counted nor short
      ride('2026-09-10', ZONE),
      ride('2026-09-12', ZONE),
      ...mondayWednesdayFriday('2026-09-14', 4, ZONE),
    ];
    const result = computeAdherence(input({ prescriptions, sessions }));
    expect(week(result, '2026-W36')).toMatchObject({ hasPrescription: false, prescribed: 0, met: false });
    expect(week(result, '2026-W37')).toMatchObject({ hasPrescription: true, prescribed: 2, counted: 2, short: 0, met: true });
    expect(result.streakWeeks).toBe(5);
  });

  it('computes the streak over the whole history, beyond the weeks returned', () => {
    const result = computeAdherence(input({ weeks: 3 }));
    expect(result.weeks.map((w) => w.isoWeek)).toEqual(['2026-W40', '2026-W41', '2026-W42']);
    expect(result.streakWeeks).toBe(10);
  });

  it('caps each week of the four-week figure at its target', () => {
    // W38: 5 sessions, W39: 1, W40–W41: 3 each → (3 + 1 + 3 + 3) / 12 = 83 %.
    const sessions = mondayWednesdayFriday(START, 10, ZONE)
      .filter((s) => !s.id.match(/2026-09-(23|25)/))
      .concat([ride('2026-09-15', ZONE), ride('2026-09-17', ZONE)]);
    const result = computeAdherence(input({ sessions }));
    expect(week(result, '2026-W38').counted).toBe(5);
    expect(week(result, '2026-W39').counted).toBe(1);
    expect(result.adherence4wPct).toBe(83);
  });

  it('has no four-week figure and no streak without a finished prescribed week', () => {
    const prescriptions = [{ effectiveFrom: CURRENT_MONDAY, sessionsPerWeek: 3, minutesPerSession: 30 }];
    const result = computeAdherence(input({ prescriptions, sessions: [ride(CURRENT_MONDAY, ZONE)] }));
    expect(result.adherence4wPct).toBeNull();
    expect(result.streakWeeks).toBe(0);
    const none = computeAdherence(input({ prescriptions: [], sessions: [] }));
    expect(none.adherence4wPct).toBeNull();
    expect(none.streakWeeks).toBe(0);
    expect(none.weeks.every((w) => !w.hasPrescription)).toBe(true);
  });

  it('refuses a non-positive week count', () => {
    expect(() => computeAdherence(input({ weeks: 0 }))).toThrow(RangeError);
  });
});
