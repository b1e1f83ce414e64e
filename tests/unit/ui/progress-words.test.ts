import { describe, it, expect } from 'vitest';
import { MEASURES, weeklySentence } from '../../../src/components/rider/progress-words';
import type { ProgressWeek } from '../../../src/components/rider/types';

// source: luxon DateTime.fromISO('2026-W41').toISODate(): the Monday of 2026-W41 is 2026-10-05
const MONDAYS = ['2026-10-05', '2026-10-12', '2026-10-19', '2026-10-26', '2026-11-02'];

function weeks(power: (number | null)[], sessions?: number[]): ProgressWeek[] {
  return power.map((p, i) => ({
    isoWeek: `2026-W${41 + i}`,
    monday: MONDAYS[i],
    sessions: sessions?.[i] ?? (p === null ? 0 : 3),
    activeMinutes: p === null ? 0 : 60 + i * 10,
    distanceM: p === null ? 0 : 5_000 * (i + 1),
    meanPowerW: p,
  }));
}
const power = (list: ProgressWeek[]) => weeklySentence(list, MEASURES.power, 'en-GB');

describe('weeklySentence', () => {
  it('says the chart fills as rides come in when no week has any', () => {
    expect(power(weeks([null, null]))).toBe('No mean power to show yet: it builds up week by week as ride files are uploaded.');
    expect(power([])).toBe('No mean power to show yet: it builds up week by week as ride files are uploaded.');
  });

  it('gives the one week with rides, as this week when it is the current one', () => {
    expect(power(weeks([null, null, 12]))).toBe('Your mean power: 12.0 W so far this week.');
  });

  it('gives the one week with rides by its Monday when it is over', () => {
    expect(power(weeks([null, 12, null]))).toBe('Your mean power: 12.0 W in the week of 12 Oct.');
  });

  it('goes from the first to the latest week and names the best one between', () => {
    expect(power(weeks([10, 25, null, 18, null]))).toBe(
      'Your mean power per week went from 10.0 W in the week of 5 Oct to 18.0 W in the week of 26 Oct. Your best week so far: 25.0 W in the week of 12 Oct.',
    );
  });

  it('says when the latest week is the best', () => {
    expect(power(weeks([10, 14, 21.25]))).toBe('Your mean power per week went from 10.0 W in the week of 5 Oct to 21.3 W so far this week. The latest week is your best so far.');
  });

  it('names no best week when the first week was the best', () => {
    expect(power(weeks([30, 20, 25]))).toBe('Your mean power per week went from 30.0 W in the week of 5 Oct to 25.0 W so far this week.');
  });

  it('counts only weeks with sessions and a value', () => {
    // A week with sessions but no power column, and a week with a value but no sessions, are both left out.
    const list = weeks([10, null, 99, 20], [3, 2, 0, 3]);
    expect(power(list)).toBe('Your mean power per week went from 10.0 W in the week of 5 Oct to 20.0 W so far this week. The latest week is your best so far.');
  });

  it('formats active minutes and distance with their own units and digits', () => {
    const list = weeks([10, 12]);
    expect(weeklySentence(list, MEASURES.minutes, 'en-GB')).toBe(
      'Your active minutes per week went from 60 min in the week of 5 Oct to 70 min so far this week. The latest week is your best so far.',
    );
    expect(weeklySentence(list, MEASURES.distance, 'en-GB')).toBe(
      'Your distance per week went from 5.0 km in the week of 5 Oct to 10.0 km so far this week. The latest week is your best so far.',
    );
  });

  // from memory (CLDR de): a decimal comma, and '5. Okt' for 5 October.
  it('words numbers and dates in the viewer’s language', () => {
    const text = weeklySentence(weeks([10.5, null]), MEASURES.power, 'de-DE');
    expect(text).toContain('10,5 W');
    expect(text).toContain('5. Okt');
  });
});
