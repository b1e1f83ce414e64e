// Program pauses as the rider's pages take them: local dates, both ends
// included; an open-ended pause has `end: null`.
import { addDays } from '../time/local-date';

export interface Pause {
  start: string;
  end: string | null;
}

export function isPaused(date: string, pauses: Pause[]): boolean {
  return pauses.some((p) => p.start <= date && (p.end === null || date <= p.end));
}

/** The first day on or after `date` outside every pause; null when an open-ended pause covers it. */
export function firstUnpausedOnOrAfter(date: string, pauses: Pause[]): string | null {
  let d = date;
  for (;;) {
    const covering = pauses.find((p) => p.start <= d && (p.end === null || d <= p.end));
    if (!covering) return d;
    if (covering.end === null) return null;
    d = addDays(covering.end, 1);
  }
}
