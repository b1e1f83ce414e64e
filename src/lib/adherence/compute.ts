// computeAdherence: the weekly adherence view of one client. Rules from the
// Kinloop supervision issue; see ./calendar.ts and ./streak.ts.
import { isoWeekOf, weeksEndingAt } from '../time/iso-week';
import { localDate } from '../time/local-date';
import { createAdherenceCalendar } from './calendar';
import { DEFAULT_COUNT_THRESHOLD_PCT } from './session-status';
import { adherencePct, lastJudgedWeeks, streakWeeks } from './streak';
import type { Adherence, AdherenceInput } from './types';

export const DEFAULT_ADHERENCE_WEEKS = 12;

export function computeAdherence(input: AdherenceInput): Adherence {
  const weekCount = input.weeks ?? DEFAULT_ADHERENCE_WEEKS;
  if (!Number.isInteger(weekCount) || weekCount < 1) throw new RangeError(`weeks must be a positive integer: ${weekCount}`);
  const calendar = createAdherenceCalendar({
    timeZone: input.timeZone,
    prescriptions: input.prescriptions,
    pauses: input.pauses,
    sessions: input.sessions,
    countThresholdPct: input.countThresholdPct ?? DEFAULT_COUNT_THRESHOLD_PCT,
  });
  const today = localDate(input.now, input.timeZone);
  const current = isoWeekOf(today, input.timeZone);
  return {
    weeks: weeksEndingAt(current, weekCount).map((week) => calendar.week(week, today)),
    streakWeeks: streakWeeks(calendar, current, today),
    adherence4wPct: adherencePct(lastJudgedWeeks(calendar, current, today, 4)),
  };
}
