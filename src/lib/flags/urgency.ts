// The order of clinical urgency in which triage lists flags and clients
// (PRODUCT.md "triage", and the issue that asked for it): a blood pressure
// rise — a reading or warning signs that may be autonomic dysreflexia — above
// everything, then the other urgent flags, then those for review, then
// information. Within a group the longest waiting comes first.
import type { FlagKind, FlagSeverity } from './types';

export interface Urgent {
  kind: FlagKind;
  severity: FlagSeverity;
  /** ISO instant. */
  raisedAt: string;
}

/** The groups in order, as the page says them. */
export const URGENCY_GROUPS = ['a blood pressure rise or warning signs of autonomic dysreflexia', 'other urgent flags', 'flags for review', 'flags for information'] as const;

export function urgencyGroup(flag: Pick<Urgent, 'kind' | 'severity'>): number {
  if (flag.kind === 'bp_rise') return 0;
  return flag.severity === 'urgent' ? 1 : flag.severity === 'review' ? 2 : 3;
}

/**
 * `urgencyGroup` as SQL over the flag columns of `alias` (kind, severity), for
 * ordering a whole list in PostgreSQL; the caseload-pages integration test
 * holds the two to the same order.
 */
export function urgencyGroupSql(alias: string): string {
  return `CASE WHEN ${alias}.kind = 'bp_rise' THEN 0 WHEN ${alias}.severity = 'urgent' THEN 1 WHEN ${alias}.severity = 'review' THEN 2 ELSE 3 END`;
}

/** Most urgent first; for flags of one group, the one raised earlier. */
export function compareUrgency(a: Urgent, b: Urgent): number {
  return urgencyGroup(a) - urgencyGroup(b) || Date.parse(a.raisedAt) - Date.parse(b.raisedAt);
}

/** Clients by their most urgent flag (their list sorted first); clients without flags last. */
export function compareClientsByUrgency(a: { flags: Urgent[] }, b: { flags: Urgent[] }): number {
  const [fa, fb] = [a.flags[0], b.flags[0]];
  if (!fa || !fb) return (fa ? 0 : 1) - (fb ? 0 : 1);
  return compareUrgency(fa, fb);
}
