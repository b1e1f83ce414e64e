// The row shapes of GET /api/triage and GET /api/caseload, as the browser receives them.
import type { ClientOverview } from '../../lib/supervision/overview';
import type { FlagView } from '../../lib/supervision/flags';
import type { CareStatus } from '../../lib/care/care-status';

export type FlagItem = FlagView;

export interface ClientRow extends ClientOverview {
  clientId: string;
  clientName: string;
  /** The client's time zone: "today" and "3 days ago" are their calendar days. */
  timeZone: string;
  /** Open, not snoozed; most urgent first (src/lib/flags/urgency.ts). */
  flags: FlagItem[];
  /** Readiness, "no plan on file" and a baseline to record. */
  care: CareStatus;
}

/** One page of triage or the caseload (src/lib/supervision/caseload.ts, CaseloadPage). */
export interface ListPage {
  clients: ClientRow[];
  total: number;
  offset: number;
  limit: number;
  nextOffset: number | null;
  all: { clients: number; flags: number; byKind: Record<string, number>; bySeverity: Record<string, number> };
}

export type FlagAction = 'acknowledge' | 'snooze' | 'resolve';
