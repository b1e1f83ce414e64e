import { describe, expect, it } from 'vitest';
import { dataPeriods, minutesText, monthOf, monthRange, periodsWithin, totalsOf } from '../../../src/lib/monitoring/periods';

describe('monitoring periods', () => {
  it('takes a calendar month in the clinic’s zone, across a clock change', () => {
    // by hand: Europe/London is on BST (UTC+1) until 25 Oct 2026 and on GMT after it, so October
    // starts at 23:00 UTC on 30 Sept and ends at 00:00 UTC on 1 Nov.
    const oct = monthRange('2026-10', 'Europe/London');
    expect(oct.start.toISOString()).toBe('2026-09-30T23:00:00.000Z');
    expect(oct.end.toISOString()).toBe('2026-11-01T00:00:00.000Z');
    expect([oct.first, oct.last]).toEqual(['2026-10-01', '2026-10-31']);
    expect(monthRange('2027-02', 'UTC').last).toBe('2027-02-28');
    // 23:30 UTC on 31 Oct is already November in Auckland (UTC+13 then).
    expect(monthOf(new Date('2026-10-31T23:30:00Z'), 'Pacific/Auckland')).toBe('2026-11');
    expect(() => monthRange('2026-13', 'UTC')).toThrow(RangeError);
  });

  it('counts days with data per 30-day period from the program start, a day with two rides once', () => {
    const days = ['2026-09-01', '2026-09-01', '2026-09-15', '2026-09-30', '2026-10-01', '2026-10-30', '2026-10-31'];
    // by hand: 1 Sept + 29 days = 30 Sept; the next period is 1–30 Oct; then 31 Oct – 29 Nov.
    expect(dataPeriods('2026-09-01', '2026-11-02', days)).toEqual([
      { from: '2026-09-01', to: '2026-09-30', daysWithData: 3, complete: true },
      { from: '2026-10-01', to: '2026-10-30', daysWithData: 2, complete: true },
      { from: '2026-10-31', to: '2026-11-29', daysWithData: 1, complete: false },
    ]);
    expect(dataPeriods('2026-12-01', '2026-11-02', days)).toEqual([]);
  });

  it('keeps the periods that share a day with the month', () => {
    const periods = dataPeriods('2026-09-01', '2026-11-02', []);
    expect(periodsWithin(periods, '2026-10-01', '2026-10-31').map((p) => p.from)).toEqual(['2026-10-01', '2026-10-31']);
    expect(periodsWithin(periods, '2026-08-01', '2026-08-31')).toEqual([]);
  });

  it('totals by activity and words the minutes without rounding up', () => {
    const t = totalsOf([
      { seconds: 600, activity: 'review' },
      { seconds: 420, activity: 'phone_call' },
      { seconds: 90, activity: 'review' },
    ]);
    expect(t).toEqual({ seconds: 1110, entries: 3, byActivity: { review: 690, phone_call: 420, message: 0, report: 0 } });
    expect(minutesText(1110)).toBe('18 min 30 s');
    expect(minutesText(59)).toBe('0 min 59 s');
    expect(minutesText(1200)).toBe('20 min');
  });
});
