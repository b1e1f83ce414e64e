import { describe, it, expect } from 'vitest';
import { isFiltering, NO_FILTER, type RowFilter } from '../../../src/components/triage/filter';
const filter = (f: Partial<RowFilter>) => ({ ...NO_FILTER, ...f });

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
