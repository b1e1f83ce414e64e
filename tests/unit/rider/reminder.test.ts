import { describe, it, expect } from 'vitest';
import { reminderDue, type ReminderInput } from '../../../src/lib/rider/reminder';

const NZ = 'Pacific/Auckland';
// Monday 5 October 2026 in Auckland is UTC+13 (from memory: New Zealand summer
// time starts on the last Sunday of September, 27 September in 2026).
function reminder(partial: Partial<ReminderInput>) {
  return reminderDue({
    timeZone: NZ,
    now: '2026-10-05T05:30:00Z', // 18:30 in Auckland
    nextDue: '2026-10-05',
    lastReminderSentAt: null,
    sessionsToday: 0,
    ...partial,
  });
}

describe('reminderDue', () => {
  it('fires in the evening of a due day with no ride yet', () => {
    expect(reminder({})).toBe(true);
  });

  it('waits for the evening hour in local time', () => {
    expect(reminder({ now: '2026-10-05T04:59:00Z' })).toBe(false); // 17:59 local
    expect(reminder({ now: '2026-10-05T05:00:00Z' })).toBe(true); // 18:00 local
    expect(reminder({ now: '2026-10-05T05:30:00Z', eveningHour: 19 })).toBe(false);
  });

  it('does not fire when a ride arrived or nothing is due today', () => {
    expect(reminder({ sessionsToday: 1 })).toBe(false);
    expect(reminder({ nextDue: '2026-10-06' })).toBe(false);
    expect(reminder({ nextDue: null })).toBe(false);
  });

  it('fires at most once per local day', () => {
    // 00:30 on Monday in Auckland, though still Sunday in UTC: same local day.
    expect(reminder({ lastReminderSentAt: '2026-10-04T11:30:00Z' })).toBe(false);
    // 23:30 on Sunday in Auckland: the day before.
    expect(reminder({ lastReminderSentAt: '2026-10-04T10:30:00Z' })).toBe(true);
  });

  it('follows London time over the end of summer time', () => {
    const base = { timeZone: 'Europe/London', lastReminderSentAt: null, sessionsToday: 0 };
    // 17:30 UTC is 18:30 BST on Saturday 24 October, but 17:30 GMT on Sunday 25 October
    // (from memory: UK summer time ends on the last Sunday of October).
    expect(reminderDue({ ...base, now: '2026-10-24T17:30:00Z', nextDue: '2026-10-24' })).toBe(true);
    expect(reminderDue({ ...base, now: '2026-10-25T17:30:00Z', nextDue: '2026-10-25' })).toBe(false);
    expect(reminderDue({ ...base, now: '2026-10-25T18:00:00Z', nextDue: '2026-10-25' })).toBe(true);
  });

  it('refuses an evening hour that is not a whole hour of the day', () => {
    expect(() => reminder({ eveningHour: 24 })).toThrow(/eveningHour/);
  });
});
