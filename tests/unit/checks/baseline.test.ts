import { describe, it, expect } from 'vitest';
import { median } from 'simple-statistics';
import { baselineSystolic } from '../../../src/lib/checks/baseline';

describe('baselineSystolic', () => {
  it("uses the therapist's value when there is one", () => {
    expect(baselineSystolic(105, [120, 130, 140])).toEqual({ value: 105, source: 'therapist' });
  });

  it('defaults to the median of earlier pre-ride readings', () => {
    const odd = [130, 98, 112, 250, 101];
    // source: simple-statistics median as the reference
    expect(baselineSystolic(null, odd)).toEqual({ value: median(odd), source: 'median_of_pre_ride' });
    expect(baselineSystolic(null, odd).value).toBe(112);
    const even = [100, 120, 110, 90];
    expect(baselineSystolic(null, even).value).toBe(median(even));
    expect(baselineSystolic(null, even).value).toBe(105);
  });

  it('says none when nothing is known', () => {
    expect(baselineSystolic(null, [])).toEqual({ value: null, source: 'none' });
  });
});
