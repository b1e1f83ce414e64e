// The slice of a session that the rider's home screens need.
export interface RiderSession {
  id: string;
  /** ISO 8601 instant; sessions without one cannot be placed in a week. */
  startedAt: string | null;
  activeS: number;
  meanPowerW: number | null;
  peakPower5sW: number | null;
  distanceM: number | null;
  /** False for a session too short to count against the prescription; such a session is no personal best. */
  counted?: boolean;
}
