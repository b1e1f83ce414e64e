// Narrowing the triage and caseload rows by flag kind, severity and client
// name: the page's choices, which the server applies to the whole list
// (src/lib/supervision/caseload.ts).
import type { FlagKind, FlagSeverity } from '../../lib/flags/types';

export interface RowFilter {
  kind: FlagKind | '';
  severity: FlagSeverity | '';
  search: string;
}

export const NO_FILTER: RowFilter = { kind: '', severity: '', search: '' };

export function isFiltering(f: RowFilter): boolean {
  return Boolean(f.kind || f.severity || f.search.trim());
}
