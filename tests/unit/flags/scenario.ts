// A demo client for flag tests (invented numbers): three 30-minute sessions a
// week from Monday 2026-08-03 in Berlin, on Mondays, Wednesdays and Fridays.
import type { FlagInput } from '../../../src/lib/flags';
import { at, mondayWednesdayFriday, ride, type DemoSession } from '../adherence/fixtures';

export const ZONE = 'Europe/Berlin';
export const START = '2026-08-03';
export const PRESCRIPTIONS = [{ effectiveFrom: START, sessionsPerWeek: 3, minutesPerSession: 30 }];

/** W32–W41 complete, plus Monday and Wednesday of W42. */
export function steadySessions(): DemoSession[] {
  return [...mondayWednesdayFriday(START, 10, ZONE), ride('2026-10-12', ZONE), ride('2026-10-14', ZONE)];
}

/** Wednesday 2026-10-14, 20:00 in Berlin (W42). */
export const NOW = at('2026-10-14', '20:00', ZONE);

export function flagInput(over: Partial<FlagInput> = {}): FlagInput {
  return { timeZone: ZONE, now: NOW, prescriptions: PRESCRIPTIONS, pauses: [], sessions: steadySessions(), ...over };
}

export function withSession(sessions: DemoSession[], id: string, change: Partial<DemoSession>): DemoSession[] {
  if (!sessions.some((s) => s.id === id)) throw new Error(`no session ${id}`);
  return sessions.map((s) => (s.id === id ? { ...s, ...change } : s));
}

export { at, ride };
