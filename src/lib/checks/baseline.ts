// A client's resting systolic pressure, against which a rise is judged. The
// therapist's value wins; without one the median of the client's earlier
// pre-ride readings stands in, as the median shrugs off the odd bad reading.

export type BaselineSource = 'therapist' | 'median_of_pre_ride' | 'none';

export function baselineSystolic(
  therapistValue: number | null,
  priorPreRideSystolics: number[],
): { value: number | null; source: BaselineSource } {
  if (therapistValue !== null && Number.isFinite(therapistValue) && therapistValue > 0) {
    return { value: therapistValue, source: 'therapist' };
  }
  const readings = priorPreRideSystolics.filter((v) => Number.isFinite(v) && v > 0).sort((a, b) => a - b);
  if (readings.length === 0) return { value: null, source: 'none' };
  const mid = Math.floor(readings.length / 2);
  const value = readings.length % 2 === 1 ? readings[mid] : (readings[mid - 1] + readings[mid]) / 2;
  return { value, source: 'median_of_pre_ride' };
}
