// Input and output of the adherence computation. Rules from the Kinloop
// supervision issue (see ./week.ts and ./streak.ts).

/** One version of a client's prescription; it holds from `effectiveFrom` until the next version. */
export interface PrescriptionVersion {
  /** local date YYYY-MM-DD in the client's time zone */
  effectiveFrom: string;
  sessionsPerWeek: number;
  minutesPerSession: number;
}

/** A program pause; both ends are inclusive local dates. */
export interface Pause {
  from: string;
  to: string;
}

export interface SessionForAdherence {
  id: string;
  /** ISO 8601 instant */
  startedAt: string;
  durationS: number;
}

export interface AdherenceInput {
  /** IANA time zone of the client */
  timeZone: string;
  /** ISO 8601 instant */
  now: string;
  prescriptions: PrescriptionVersion[];
  pauses: Pause[];
  sessions: SessionForAdherence[];
  /** A session counts when it lasts at least this share of the prescribed minutes; default 80. */
  countThresholdPct?: number;
  /** How many weeks to return, ending with the current week; default 12. */
  weeks?: number;
}

export interface AdherenceWeek {
  isoWeek: string;
  monday: string;
  /** Sessions the week asks for: prorated by its unpaused, prescribed days, rounded up. */
  prescribed: number;
  counted: number;
  short: number;
  met: boolean;
  paused: boolean;
  finished: boolean;
  hasPrescription: boolean;
}

export interface Adherence {
  /** oldest first, ending with the current week */
  weeks: AdherenceWeek[];
  streakWeeks: number;
  adherence4wPct: number | null;
}
