// A rider's personal bests. On a tie the earlier session keeps the best, since
// that is when it was first reached. Zero values are not bests, and neither is
// anything from a session too short to count (a false start, a test spin).
import { isoWeekKey } from '../time/iso-week';
import { localDate, mondayOf } from '../time/local-date';
import type { RiderSession } from './types';

type BestInput = Pick<RiderSession, 'id' | 'startedAt' | 'activeS' | 'peakPower5sW' | 'distanceM' | 'counted'>;

export interface PersonalBests {
  longestActive: { sessionId: string; startedAt: string | null; activeS: number } | null;
  highestPower5s: { sessionId: string; startedAt: string | null; peakPower5sW: number } | null;
  mostDistanceWeek: { isoWeek: string; monday: string; distanceM: number; sessions: number } | null;
}

export function personalBests(sessions: BestInput[], timeZone: string): PersonalBests {
  const ordered = [...sessions].sort(byStart);
  let longestActive: PersonalBests['longestActive'] = null;
  let highestPower5s: PersonalBests['highestPower5s'] = null;
  const weeks = new Map<string, { isoWeek: string; monday: string; distanceM: number; sessions: number }>();

  for (const s of ordered) {
    if (s.counted === false) continue;
    if (s.activeS > 0 && (longestActive === null || s.activeS > longestActive.activeS)) {
      longestActive = { sessionId: s.id, startedAt: s.startedAt, activeS: s.activeS };
    }
    const power = s.peakPower5sW;
    if (power !== null && power > 0 && (highestPower5s === null || power > highestPower5s.peakPower5sW)) {
      highestPower5s = { sessionId: s.id, startedAt: s.startedAt, peakPower5sW: power };
    }
    if (s.startedAt !== null && s.distanceM !== null && s.distanceM > 0) {
      const date = localDate(s.startedAt, timeZone);
      const isoWeek = isoWeekKey(date);
      const week = weeks.get(isoWeek) ?? { isoWeek, monday: mondayOf(date), distanceM: 0, sessions: 0 };
      week.distanceM += s.distanceM;
      week.sessions += 1;
      weeks.set(isoWeek, week);
    }
  }

  let mostDistanceWeek: PersonalBests['mostDistanceWeek'] = null;
  for (const w of [...weeks.values()].sort((a, b) => a.monday.localeCompare(b.monday))) {
    if (mostDistanceWeek === null || w.distanceM > mostDistanceWeek.distanceM) mostDistanceWeek = w;
  }
  return { longestActive, highestPower5s, mostDistanceWeek };
}

function byStart(a: { startedAt: string | null }, b: { startedAt: string | null }): number {
  if (a.startedAt === b.startedAt) return 0;
  if (a.startedAt === null) return 1;
  if (b.startedAt === null) return -1;
  return Date.parse(a.startedAt) - Date.parse(b.startedAt);
}
