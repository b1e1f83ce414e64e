// Program pauses: inclusive ranges of local dates in which the program is
// suspended (PRODUCT.md, "pause").
import { assertLocalDate } from '../time/local-date';
import type { Pause } from './types';

export function pausedOn(pauses: Pause[]): (date: string) => boolean {
  for (const pause of pauses) {
    assertLocalDate(pause.from);
    assertLocalDate(pause.to);
  }
  return (date) => pauses.some((pause) => pause.from <= date && date <= pause.to);
}
