import { describe, it, expect } from 'vitest';
import { reminderDue, type ReminderInput } from '../../../src/lib/rider/reminder';

const NZ = 'Pacific/Auckland';
// Monday 5 October 2026 in Auckland is UTC+13 (from memory: New Zealand summer
// time starts on the last Sunday of September, 27 September in 2026).
function reminder(partial: Partial<ReminderInput>) {
  return reminderDue({
    timeZone: NZ,
    now: '2026-10-05T05:30:00Z', // 18:30 in Auckland
    eveningHour: 18,
    nextDue: '2026-10-05',
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

  it('takes "today" in the client’s zone, not in UTC', () => {
    // 00:30 on Tuesday 6 October in Auckland is still Monday 11:30 in UTC: Monday's reminder is over.
    expect(reminder({ now: '2026-10-05T11:30:00Z' })).toBe(false);
    expect(reminder({ now: '2026-10-05T11:30:00Z', nextDue: '2026-10-06' })).toBe(false);
  });

  it('follows London time over the end of summer time', () => {
    const base = { timeZone: 'Europe/London', eveningHour: 18, sessionsToday: 0 };
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
