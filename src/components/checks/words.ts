// Plain words for what a check holds, for the form, its outcome and the list of recent checks.
import type { BloodPressure } from '../../lib/checks/check-input';

/** "118/76 mmHg". */
export function pressure(bp: BloodPressure): string {
  return `${bp.systolic}/${bp.diastolic} mmHg`;
}

/** One reading time's line, e.g. "150/90 mmHg, 5 min after the ride, 82 bpm", or null when nothing was taken. */
export function readingLine(bp: BloodPressure | null | undefined, heartRate: number | null | undefined, minutesAfter?: number | null): string | null {
  const parts = [
    bp ? pressure(bp) : null,
    bp && minutesAfter !== null && minutesAfter !== undefined ? `${minutesAfter} min after the ride` : null,
    heartRate !== null && heartRate !== undefined ? `heart rate ${heartRate} bpm` : null,
  ].filter((p): p is string => p !== null);
  return parts.length ? parts.join(', ') : null;
}
