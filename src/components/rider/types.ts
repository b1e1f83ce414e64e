// The JSON the rider and carer pages read: GET /api/clients/:id/week,
// /progress, /goal and /api/routes.
import type { RoutePoint } from '../../lib/goals/route';
import type { WeekProgress } from '../../lib/rider/weekly-progress';

export interface ClientChoice {
  id: string;
  name: string;
  timeZone: string;
  programStart: string | null;
}

export interface WeekSession {
  id: string;
  startedAt: string | null;
  durationS: number;
  activeS: number;
  meanPowerW: number | null;
  distanceM: number | null;
  counted: boolean;
}

export type NextDueReason = 'no_target' | 'paused' | 'week_met' | 'due_today' | 'due';

export interface WeekTarget {
  from: string;
  sessionsPerWeek: number;
  minutesPerSession: number;
  resistance: number | null;
}

export interface WeekData {
  clientId: string;
  /** The prescription in effect today, and the next version when one is coming (an accepted step, say). */
  target: WeekTarget | null;
  nextTarget: WeekTarget | null;
  name: string;
  timeZone: string;
  isoWeek: string;
  prescribed: number | null;
  counted: number;
  short: number;
  sessions: WeekSession[];
  streakWeeks: number;
  nextDue: { date: string | null; reason: NextDueReason };
  latest: {
    id: string;
    startedAt: string | null;
    durationS: number;
    activeS: number;
    meanPowerW: number | null;
    peakPower5sW: number | null;
    distanceM: number | null;
  } | null;
  progressLine: string | null;
  paused: { from: string; to: string | null; reason: string | null } | null;
  lastUploadAt: string | null;
}

export type ProgressWeek = WeekProgress;

export interface ProgressData {
  weeks: ProgressWeek[];
  bests: {
    longestActive: { sessionId: string; startedAt: string; activeS: number } | null;
    highestPower5s: { sessionId: string; startedAt: string; peakPower5sW: number } | null;
    mostDistanceWeek: { isoWeek: string; monday: string; distanceM: number; sessions: number } | null;
  };
  totals: { sessions: number; activeMinutes: number; distanceM: number };
}

export interface RouteChoice {
  id: string;
  name: string;
  lengthM: number;
  points: RoutePoint[];
}

export interface GoalProgress {
  travelledM: number;
  totalM: number;
  fraction: number;
  passed: { name: string; atM: number }[];
  next: { name: string; remainingM: number } | null;
  position: { lat: number; lon: number };
  finished: boolean;
}

export interface Goal {
  route: { id: string | null; name: string; lengthM: number; points: RoutePoint[] };
  countFrom: string;
  distanceM: number;
  progress: GoalProgress;
}
