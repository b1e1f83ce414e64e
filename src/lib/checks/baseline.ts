// A client's resting systolic pressure, against which a rise is judged. The
// therapist's value wins; without one the median of the client's earlier
// pre-ride readings stands in, as the median shrugs off the odd bad reading.
import { median } from '../analytics/median';

export type BaselineSource = 'therapist' | 'median_of_pre_ride' | 'none';

export function baselineSystolic(
  therapistValue: number | null,
  priorPreRideSystolics: number[],
): { value: number | null; source: BaselineSource } {
  if (therapistValue !== null && Number.isFinite(therapistValue) && therapistValue > 0) {
    return { value: therapistValue, source: 'therapist' };
  }
  const value = median(priorPreRideSystolics.filter((v) => v > 0));
  return value === null ? { value: null, source: 'none' } : { value, source: 'median_of_pre_ride' };
}
