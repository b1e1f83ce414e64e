import { describe, it, expect } from 'vitest';
import { DateTime } from 'luxon';
import { nextSessionDue, type NextSessionInput } from '../../../src/lib/rider/next-session';
import { isoWeekKey } from '../../../src/lib/time/iso-week';

const NZ = 'Pacific/Auckland';
// Local noon in Auckland on a date, as an instant.
const nzNoon = (date: string) => DateTime.fromISO(`${date}T12:00`, { zone: NZ }).toUTC().toISO() as string;

function due(partial: Partial<NextSessionInput>) {
  return nextSessionDue({
    timeZone: NZ,
    now: nzNoon('2026-10-05'),
    sessionsPerWeek: 3,
    countedThisWeek: 0,
    lastSessionAt: null,
    pauses: [],
    ...partial,
  });
}

// 2026-10-05 is a Monday (ISO week 2026-W41).
describe('nextSessionDue', () => {
  it('is due today at the start of a fresh week', () => {
    expect(due({})).toEqual({ dueLocalDate: '2026-10-05', reason: 'due_today', remainingThisWeek: 3 });
  });

  it('leaves a rest day between rides at 3 a week', () => {
    const r = due({ now: nzNoon('2026-10-06'), countedThisWeek: 1, lastSessionAt: nzNoon('2026-10-05') });
    expect(r).toEqual({ dueLocalDate: '2026-10-07', reason: 'due', remainingThisWeek: 2 });
  });

  it('never puts a second ride on a day that already had one', () => {
    const r = due({ sessionsPerWeek: 6, countedThisWeek: 1, lastSessionAt: nzNoon('2026-10-05') });
    expect(r.dueLocalDate).toBe('2026-10-06');
  });

  it('moves to the next week once the target is met', () => {
    const r = due({ now: nzNoon('2026-10-09'), countedThisWeek: 3, lastSessionAt: nzNoon('2026-10-09') });
    expect(r).toEqual({ dueLocalDate: '2026-10-12', reason: 'week_met', remainingThisWeek: 0 });
  });

  it('keeps the rest after a Sunday ride when the next week starts', () => {
    const r = due({ now: nzNoon('2026-10-11'), countedThisWeek: 3, lastSessionAt: nzNoon('2026-10-11') });
    expect(r.dueLocalDate).toBe('2026-10-13');
  });

  it('gives up the rest when the week is running out', () => {
    const r = due({ now: nzNoon('2026-10-10'), countedThisWeek: 1, lastSessionAt: nzNoon('2026-10-09') });
    expect(r).toEqual({ dueLocalDate: '2026-10-10', reason: 'due_today', remainingThisWeek: 2 });
  });

  it('crosses the week boundary in the client time zone, not UTC', () => {
    // 11:30 UTC on Sunday 4 October is 00:30 on Monday 5 October in Auckland
    // (from memory: NZDT, UTC+13, from the last Sunday of September).
    const now = '2026-10-04T11:30:00Z';
    const lastSessionAt = '2026-10-04T05:00:00Z'; // Sunday 18:00 in Auckland
    expect(isoWeekKey('2026-10-05')).toBe('2026-W41');
    const r = due({ now, countedThisWeek: 0, lastSessionAt });
    expect(r).toEqual({ dueLocalDate: '2026-10-06', reason: 'due', remainingThisWeek: 3 });
  });

  it('uses the London date over the end of summer time', () => {
    // 23:30 UTC on Saturday 24 October is 00:30 BST on Sunday 25 October; by
    // 23:30 UTC on Sunday the clocks are back and it is still Sunday (from
    // memory: UK summer time ends on the last Sunday of October, 01:00 UTC).
    const base = { timeZone: 'Europe/London', sessionsPerWeek: 3, pauses: [] };
    expect(
      nextSessionDue({ ...base, now: '2026-10-24T23:30:00Z', countedThisWeek: 2, lastSessionAt: '2026-10-23T10:00:00Z' }),
    ).toEqual({ dueLocalDate: '2026-10-25', reason: 'due_today', remainingThisWeek: 1 });
    expect(
      nextSessionDue({ ...base, now: '2026-10-25T23:30:00Z', countedThisWeek: 3, lastSessionAt: '2026-10-23T10:00:00Z' }),
    ).toEqual({ dueLocalDate: '2026-10-26', reason: 'week_met', remainingThisWeek: 0 });
  });

  it('in a pause is due the first day after it', () => {
    const pauses = [{ start: '2026-10-03', end: '2026-10-08' }];
    expect(due({ pauses })).toEqual({ dueLocalDate: '2026-10-09', reason: 'paused', remainingThisWeek: 3 });
    expect(due({ pauses: [{ start: '2026-10-01', end: null }] })).toEqual({
      dueLocalDate: null,
      reason: 'paused',
      remainingThisWeek: 3,
    });
  });

  it('skips paused days later in the week', () => {
    const r = due({
      now: nzNoon('2026-10-06'),
      countedThisWeek: 1,
      lastSessionAt: nzNoon('2026-10-05'),
      pauses: [{ start: '2026-10-07', end: '2026-10-08' }],
    });
    expect(r.dueLocalDate).toBe('2026-10-09');
  });

  it('when the week cannot be completed any more, points at the next week', () => {
    const r = due({ now: nzNoon('2026-10-11'), countedThisWeek: 2, lastSessionAt: nzNoon('2026-10-11') });
    expect(r).toEqual({ dueLocalDate: '2026-10-13', reason: 'due', remainingThisWeek: 1 });
  });

  it('skips a next week that is paused throughout', () => {
    const r = due({
      now: nzNoon('2026-10-09'),
      countedThisWeek: 3,
      lastSessionAt: nzNoon('2026-10-09'),
      pauses: [{ start: '2026-10-12', end: '2026-10-20' }],
    });
    expect(r).toEqual({ dueLocalDate: '2026-10-21', reason: 'week_met', remainingThisWeek: 0 });
  });

  it('has nothing due without a prescription', () => {
    expect(due({ sessionsPerWeek: 0 })).toEqual({ dueLocalDate: null, reason: 'no_target', remainingThisWeek: 0 });
  });

  // A rider who rides on each due day over three weeks: one ride a day at most, N a week.
  it.each([
    [2, ['Mon', 'Fri', 'Tue', 'Sat', 'Wed', 'Sun']],
    [3, ['Mon', 'Wed', 'Fri', 'Mon', 'Wed', 'Fri', 'Mon', 'Wed', 'Fri']],
    [4, ['Mon', 'Wed', 'Fri', 'Sun', 'Mon', 'Wed', 'Fri', 'Sun', 'Mon', 'Wed', 'Fri', 'Sun']],
  ])('spreads %i a week over the week', (perWeek, expected) => {
    const rides: string[] = [];
    let last: string | null = null;
    for (let date = '2026-10-05'; date < '2026-10-26'; date = DateTime.fromISO(date).plus({ days: 1 }).toISODate() as string) {
      const monday = DateTime.fromISO(date).startOf('week').toISODate() as string;
      const counted = rides.filter((d) => d >= monday && d <= date).length;
      const r = nextSessionDue({
        timeZone: NZ,
        now: nzNoon(date),
        sessionsPerWeek: perWeek,
        countedThisWeek: counted,
        lastSessionAt: last === null ? null : nzNoon(last),
        pauses: [],
      });
      if (r.dueLocalDate === date) {
        rides.push(date);
        last = date;
      }
    }
    expect(rides.map((d) => DateTime.fromISO(d).toFormat('ccc'))).toEqual(expected);
    expect(new Set(rides).size).toBe(rides.length);
  });
});
