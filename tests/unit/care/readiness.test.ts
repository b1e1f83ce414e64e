import { describe, expect, it } from 'vitest';
import { readinessOf, type ReadinessInput } from '../../../src/lib/care/readiness';

const ok = { status: 'no_concern' as const };
const input = (over: Partial<ReadinessInput>): ReadinessInput => ({
  screening: { assessedOn: '2026-01-10', items: [ok, ok, ok] },
  clearance: { clearedOn: '2026-01-12', reviewOn: '2027-01-12' },
  today: '2026-06-01',
  dueWithinDays: 30,
  ...over,
});

describe('readinessOf', () => {
  it('cleared while the review is more than 30 days away', () => {
    expect(readinessOf(input({}))).toBe('cleared');
  });
  it('due for review within 30 days of the review date: 2026-12-13 is 30 days before 2027-01-12', () => {
    expect(readinessOf(input({ today: '2026-12-12' }))).toBe('cleared');
    expect(readinessOf(input({ today: '2026-12-13' }))).toBe('clearance_due');
    expect(readinessOf(input({ today: '2027-01-12' }))).toBe('clearance_due');
  });
  it('expired the day after the review date', () => {
    expect(readinessOf(input({ today: '2027-01-13' }))).toBe('clearance_expired');
  });
  it('not screened without a screening or with an item not assessed', () => {
    expect(readinessOf(input({ screening: null }))).toBe('not_screened');
    expect(readinessOf(input({ screening: { assessedOn: '2026-01-10', items: [ok, { status: 'not_assessed' }] } }))).toBe('not_screened');
  });
  it('a concern stands until a clearance dated on or after the screening', () => {
    const concern = { assessedOn: '2026-02-01', items: [ok, { status: 'concern' as const }] };
    expect(readinessOf(input({ screening: concern }))).toBe('screened_concerns');
    expect(readinessOf(input({ screening: concern, clearance: { clearedOn: '2026-02-01', reviewOn: '2027-02-01' } }))).toBe('cleared');
  });
  it('screened without a clearance on file', () => {
    expect(readinessOf(input({ clearance: null }))).toBe('awaiting_clearance');
  });
});
