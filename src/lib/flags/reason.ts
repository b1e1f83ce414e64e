// The sentences that say why a missed-sessions flag was raised, from its
// evidence: weeks are written as the date they start ("the week of 23
// November"), days as dates, in the locale given. The planner stores them in
// REASON_LOCALE; pages word them again in the clinic's locale, so a flag
// reads the same on triage, the client's page and the report.
import { count } from '../format/numbers';
import { formatDate, weekOf } from '../time/format';
import type { MissedWeekEvidence, NoSessionEvidence } from './types';

export function missedWeekReason(e: Pick<MissedWeekEvidence, 'monday' | 'prescribed' | 'counted'>, locale: string): string {
  const span = weekOf(e.monday, locale);
  return e.counted === 0
    ? `No session counted in ${span}, where ${e.prescribed} ${e.prescribed === 1 ? 'was' : 'were'} prescribed.`
    : `Only ${e.counted} of the ${e.prescribed} prescribed sessions counted in ${span}.`;
}

export function noSessionReason(e: Pick<NoSessionEvidence, 'since' | 'lastSessionId' | 'days' | 'pausedDays'>, locale: string): string {
  const paused = e.pausedDays > 0 ? ` (${count(e.pausedDays, 'paused day')} not counted)` : '';
  const since = formatDate(e.since, locale, 'weekdayDayMonth');
  return e.lastSessionId ? `No session for ${e.days} days${paused} since the last one on ${since}.` : `No session in the ${e.days} days${paused} since the program started on ${since}.`;
}

/** A flag's reason in `locale`: missed sessions worded again from their evidence, the others as stored. */
export function flagReason(flag: { kind: string; reason: string; evidence: unknown }, locale: string): string {
  const e = flag.evidence as Partial<MissedWeekEvidence | NoSessionEvidence> | null;
  if (flag.kind !== 'missed_sessions' || !e) return flag.reason;
  if (e.rule === 'missed_week' && typeof e.monday === 'string') return missedWeekReason(e as MissedWeekEvidence, locale);
  if (e.rule === 'no_session' && typeof e.since === 'string') return noSessionReason(e as NoSessionEvidence, locale);
  return flag.reason;
}
