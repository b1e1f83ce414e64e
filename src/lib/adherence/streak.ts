// Streak and four-week adherence. Rules from the Kinloop supervision issue:
// - streak: consecutive met weeks counting back from the last finished week;
//   the current, unfinished week adds one once it is met (and never breaks
//   it); paused weeks are skipped; a week without prescription ends it. It
//   runs over the whole history, not only the weeks shown.
// - adherence4wPct: Σ min(counted, prescribed) ÷ Σ prescribed over the last
//   four finished, unpaused weeks with a prescription, × 100, rounded; extra
//   sessions in one week do not make up for another.
import { previousWeek, type IsoWeek } from '../time/iso-week';
import type { AdherenceCalendar } from './calendar';
import type { AdherenceWeek, SessionForAdherence } from './types';

export function streakWeeks<S extends SessionForAdherence>(
  calendar: AdherenceCalendar<S>,
  current: IsoWeek,
  today: string,
): number {
  const thisWeek = calendar.week(current, today);
  if (!thisWeek.hasPrescription) return 0;
  let streak = thisWeek.met ? 1 : 0;
  // Ends at the latest in the week before the first prescription, which has none.
  for (let week = previousWeek(current); ; week = previousWeek(week)) {
    const status = calendar.week(week, today);
    if (!status.hasPrescription) return streak;
    if (status.paused) continue;
    if (!status.met) return streak;
    streak += 1;
  }
}

/** The last `count` finished, unpaused weeks with a prescription, newest first. */
export function lastJudgedWeeks<S extends SessionForAdherence>(
  calendar: AdherenceCalendar<S>,
  current: IsoWeek,
  today: string,
  count: number,
): AdherenceWeek[] {
  const start = calendar.timeline.programStart;
  const found: AdherenceWeek[] = [];
  if (!start) return found;
  for (let week = previousWeek(current); found.length < count && week.sunday >= start; week = previousWeek(week)) {
    const status = calendar.week(week, today);
    if (status.hasPrescription && !status.paused) found.push(status);
  }
  return found;
}

export function adherencePct(weeks: AdherenceWeek[]): number | null {
  const prescribed = weeks.reduce((sum, w) => sum + w.prescribed, 0);
  if (prescribed === 0) return null;
  const done = weeks.reduce((sum, w) => sum + Math.min(w.counted, w.prescribed), 0);
  return Math.round((done / prescribed) * 100);
}
