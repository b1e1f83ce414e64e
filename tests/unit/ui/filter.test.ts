import { describe, it, expect } from 'vitest';
import { filterRows, flagCounts, isFiltering, NO_FILTER, type RowFilter } from '../../../src/lib/supervision/list-filter';
import type { ClientRow, FlagItem } from '../../../src/components/triage/types';
import type { FlagKind, FlagSeverity } from '../../../src/lib/flags/types';

let flagId = 0;
function flag(kind: FlagKind, severity: FlagSeverity): FlagItem {
  flagId++;
  return {
    id: `f${flagId}`,
    clientId: 'c',
    kind,
    severity,
    state: 'open',
    raisedAt: '2026-10-01T09:00:00.000Z',
    updatedAt: '2026-10-01T09:00:00.000Z',
    reason: 'demo reason',
    evidence: null,
    clearedAt: null,
    snoozedUntil: null,
  };
}

function row(clientName: string, flags: FlagItem[]): ClientRow {
  return { clientId: clientName.toLowerCase().replace(/\s+/g, '-'), clientName, flags, lastSessionAt: null, adherence4wPct: null, streakWeeks: 0, powerTrendWPerWeek: null };
}

const rows: ClientRow[] = [
  row('Ann Smith', [flag('bp_rise', 'urgent'), flag('missed_sessions', 'review')]),
  row('Joanna Kerr', [flag('power_drop', 'review')]),
  row('Bill Andrews', [flag('missed_sessions', 'info'), flag('skin_concern', 'urgent')]),
  row('Cato Lee', []),
];
const filter = (f: Partial<RowFilter>) => ({ ...NO_FILTER, ...f });
const names = (list: ClientRow[]) => list.map((r) => r.clientName);

describe('isFiltering', () => {
  it('is false for no filter and for a search of spaces', () => {
    expect(isFiltering(NO_FILTER)).toBe(false);
    expect(isFiltering(filter({ search: '   ' }))).toBe(false);
  });

  it('is true with a kind, a severity or search words', () => {
    expect(isFiltering(filter({ kind: 'bp_rise' }))).toBe(true);
    expect(isFiltering(filter({ severity: 'info' }))).toBe(true);
    expect(isFiltering(filter({ search: 'ann' }))).toBe(true);
  });
});

describe('filterRows', () => {
  it('keeps every row, in order and with all flags, without a filter', () => {
    expect(filterRows(rows, NO_FILTER)).toEqual(rows);
  });

  it('finds a client by a part of the name, ignoring case', () => {
    expect(names(filterRows(rows, filter({ search: 'AN' })))).toEqual(['Ann Smith', 'Joanna Kerr', 'Bill Andrews']);
    expect(names(filterRows(rows, filter({ search: 'kerr' })))).toEqual(['Joanna Kerr']);
  });

  it('needs every search word, in any order, with any spacing', () => {
    expect(names(filterRows(rows, filter({ search: '  smith   ann ' })))).toEqual(['Ann Smith']);
    expect(names(filterRows(rows, filter({ search: 'smith kerr' })))).toEqual([]);
  });

  it('keeps a client without flags when only searching', () => {
    expect(names(filterRows(rows, filter({ search: 'lee' })))).toEqual(['Cato Lee']);
  });

  it('keeps only the flags of the chosen kind and drops rows left without any', () => {
    const out = filterRows(rows, filter({ kind: 'missed_sessions' }));
    expect(names(out)).toEqual(['Ann Smith', 'Bill Andrews']);
    expect(out.map((r) => r.flags.map((f) => f.kind))).toEqual([['missed_sessions'], ['missed_sessions']]);
  });

  it('combines kind, severity and search', () => {
    expect(names(filterRows(rows, filter({ severity: 'urgent' })))).toEqual(['Ann Smith', 'Bill Andrews']);
    expect(names(filterRows(rows, filter({ kind: 'missed_sessions', severity: 'info' })))).toEqual(['Bill Andrews']);
    expect(names(filterRows(rows, filter({ severity: 'urgent', search: 'bill' })))).toEqual(['Bill Andrews']);
    expect(filterRows(rows, filter({ kind: 'bp_rise', severity: 'info' }))).toEqual([]);
  });

  it('leaves the rows it was given unchanged', () => {
    const before = structuredClone(rows);
    filterRows(rows, filter({ kind: 'bp_rise', search: 'ann' }));
    expect(rows).toEqual(before);
  });

  it('handles no rows', () => {
    expect(filterRows([], filter({ kind: 'bp_rise', search: 'x' }))).toEqual([]);
  });
});

describe('flagCounts', () => {
  it('counts the flags of every row by kind and by severity', () => {
    const { kind, severity } = flagCounts(rows);
    expect(Object.fromEntries(kind)).toEqual({ bp_rise: 1, missed_sessions: 2, power_drop: 1, skin_concern: 1 });
    expect(Object.fromEntries(severity)).toEqual({ urgent: 2, review: 2, info: 1 });
  });

  it('has no entries for kinds that do not occur', () => {
    const { kind } = flagCounts(rows);
    expect(kind.has('current_rise')).toBe(false);
  });

  it('is empty for no rows', () => {
    const { kind, severity } = flagCounts([]);
    expect(kind.size).toBe(0);
    expect(severity.size).toBe(0);
  });
});
