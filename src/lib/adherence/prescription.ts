// Which prescription version is in effect on a local date. Rules from the
// Kinloop supervision issue: a version holds from its effective date until the
// next one; a version asking for 0 sessions a week prescribes nothing.
import { assertLocalDate } from '../time/local-date';
import type { PrescriptionVersion } from './types';

export interface PrescriptionTimeline {
  versionOn(date: string): PrescriptionVersion | null;
  /** True when a version asking for at least one session a week is in effect. */
  prescribedOn(date: string): boolean;
  /** The first local date on which sessions are prescribed, or null. */
  programStart: string | null;
}

export function prescriptionTimeline(versions: PrescriptionVersion[]): PrescriptionTimeline {
  for (const version of versions) assertLocalDate(version.effectiveFrom);
  // A stable sort keeps the order given for versions of the same date, and the
  // last of those wins: it is the one written last.
  const sorted = [...versions].sort((a, b) => a.effectiveFrom.localeCompare(b.effectiveFrom));

  const versionOn = (date: string): PrescriptionVersion | null => {
    for (let i = sorted.length - 1; i >= 0; i--) {
      if (sorted[i].effectiveFrom <= date) return sorted[i];
    }
    return null;
  };
  const prescribedOn = (date: string): boolean => (versionOn(date)?.sessionsPerWeek ?? 0) > 0;
  const programStart = sorted.map((v) => v.effectiveFrom).find(prescribedOn) ?? null;

  return { versionOn, prescribedOn, programStart };
}
