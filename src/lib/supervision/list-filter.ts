// Narrowing the triage and caseload rows by flag kind, severity and client
// name: the server does it over the whole list (caseload.ts), the page says
// what is narrowed. Pure, for both.
import type { FlagKind, FlagSeverity } from '../flags/types';

interface Row<F extends { kind: FlagKind; severity: FlagSeverity }> {
  clientName: string;
  flags: F[];
}

export interface RowFilter {
  kind: FlagKind | '';
  severity: FlagSeverity | '';
  search: string;
}

export const NO_FILTER: RowFilter = { kind: '', severity: '', search: '' };

export function isFiltering(f: RowFilter): boolean {
  return Boolean(f.kind || f.severity || f.search.trim());
}

/**
 * Rows whose client name contains the search words. With a kind or severity
 * chosen, each row keeps only the flags that match, and rows left without
 * flags drop out.
 */
export function filterRows<F extends { kind: FlagKind; severity: FlagSeverity }, R extends Row<F>>(rows: R[], f: RowFilter): R[] {
  const words = f.search.trim().toLocaleLowerCase().split(/\s+/).filter(Boolean);
  const byFlag = Boolean(f.kind || f.severity);
  return rows.flatMap((row) => {
    const name = row.clientName.toLocaleLowerCase();
    if (!words.every((w) => name.includes(w))) return [];
    if (!byFlag) return [row];
    const flags = row.flags.filter((flag) => (!f.kind || flag.kind === f.kind) && (!f.severity || flag.severity === f.severity));
    return flags.length ? [{ ...row, flags }] : [];
  });
}

/** How many open flags of each kind and severity the rows hold, for the filter menus. */
export function flagCounts(rows: Row<{ kind: FlagKind; severity: FlagSeverity }>[]): { kind: Map<FlagKind, number>; severity: Map<FlagSeverity, number> } {
  const kind = new Map<FlagKind, number>();
  const severity = new Map<FlagSeverity, number>();
  for (const flag of rows.flatMap((r) => r.flags)) {
    kind.set(flag.kind, (kind.get(flag.kind) ?? 0) + 1);
    severity.set(flag.severity, (severity.get(flag.severity) ?? 0) + 1);
  }
  return { kind, severity };
}
