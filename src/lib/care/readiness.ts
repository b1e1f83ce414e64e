// Whether a client is ready to ride: screening done and a medical clearance
// that is current. Pure: the records and today's date in, a state out.
import { addDays } from '../time/local-date';

export const READINESS_STATES = ['not_screened', 'screened_concerns', 'awaiting_clearance', 'cleared', 'clearance_due', 'clearance_expired'] as const;
export type Readiness = (typeof READINESS_STATES)[number];

export const READINESS_LABELS: Record<Readiness, string> = {
  not_screened: 'Not screened',
  screened_concerns: 'Screened — concerns',
  awaiting_clearance: 'Screened — no clearance on file',
  cleared: 'Cleared',
  clearance_due: 'Clearance due for review',
  clearance_expired: 'Clearance expired',
};

export type ScreeningStatus = 'not_assessed' | 'no_concern' | 'concern';

export interface ReadinessInput {
  /** The current screening version; null when none was recorded. */
  screening: { assessedOn: string; items: { status: ScreeningStatus }[] } | null;
  /** The newest clearance; null when none is on file. */
  clearance: { clearedOn: string; reviewOn: string } | null;
  /** Today in the client's zone, YYYY-MM-DD. */
  today: string;
  dueWithinDays: number;
}

/**
 * The order matters: an expired clearance is the most pressing; then a
 * screening that is missing or has an item not assessed; then a concern that
 * no clearance has answered (a clearance dated on or after the screening was
 * given knowing it); then a screening without any clearance.
 */
export function readinessOf(input: ReadinessInput): Readiness {
  const { screening, clearance, today } = input;
  if (clearance !== null && clearance.reviewOn < today) return 'clearance_expired';
  if (screening === null || screening.items.length === 0 || screening.items.some((i) => i.status === 'not_assessed')) return 'not_screened';
  const concern = screening.items.some((i) => i.status === 'concern');
  if (concern && (clearance === null || clearance.clearedOn < screening.assessedOn)) return 'screened_concerns';
  if (clearance === null) return 'awaiting_clearance';
  const dueFrom = addDays(clearance.reviewOn, -input.dueWithinDays);
  return today >= dueFrom ? 'clearance_due' : 'cleared';
}

/** Readiness that lets a prescription be saved without asking. */
export function isCleared(r: Readiness): boolean {
  return r === 'cleared' || r === 'clearance_due';
}
