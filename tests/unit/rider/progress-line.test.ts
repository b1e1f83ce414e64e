import { describe, it, expect } from 'vitest';
import { DateTime } from 'luxon';
import { progressLine } from '../../../src/lib/rider/progress-line';

const TZ = 'Europe/London';
const START = '2026-03-02';
const NOW = '2026-07-01T12:00:00Z';

// n rides starting on `from`, two days apart, at local noon.
function rides(from: string, n: number, activeMin: number, powerW: number | null) {
  return Array.from({ length: n }, (_, i) => ({
    startedAt: DateTime.fromISO(`${from}T12:00`, { zone: TZ }).plus({ days: 2 * i }).toUTC().toISO() as string,
    activeS: activeMin * 60,
    meanPowerW: powerW,
  }));
}

describe('progressLine', () => {
  it('reports a rise in active minutes', () => {
    const line = progressLine([...rides('2026-03-03', 8, 12, 8), ...rides('2026-06-05', 10, 24, 8)], START, NOW, TZ);
    expect(line).toBe('Over the past month your sessions averaged 24 active minutes, up from 12 in your first month.');
  });

  it('falls back to a rise in mean power when minutes are steady', () => {
    const line = progressLine([...rides('2026-03-03', 8, 30, 9), ...rides('2026-06-05', 10, 30, 18)], START, NOW, TZ);
    expect(line).toBe('Over the past month your sessions averaged 18 watts of power, up from 9 in your first month.');
  });

  it('says "about the same" when nothing rose', () => {
    const line = progressLine([...rides('2026-03-03', 8, 30, 20), ...rides('2026-06-05', 10, 30, 20)], START, NOW, TZ);
    expect(line).toBe('Over the past month your sessions averaged 30 active minutes, about the same as in your first month.');
  });

  it('states the rides completed, without judging, when both fell', () => {
    const line = progressLine(
      [...rides('2026-03-03', 8, 30, 20), ...rides('2026-04-10', 5, 25, 18), ...rides('2026-06-05', 10, 20, 15)],
      START,
      NOW,
      TZ,
    );
    expect(line).toBe('You have completed 23 sessions since your program started.');
  });

  it('prefers a power gain over stating a fall in minutes', () => {
    const line = progressLine([...rides('2026-03-03', 8, 30, 9), ...rides('2026-06-05', 10, 25, 18)], START, NOW, TZ);
    expect(line).toContain('18 watts of power, up from 9');
  });

  it('is null until the first month and the past month no longer overlap', () => {
    const all = [...rides('2026-03-03', 8, 12, 8), ...rides('2026-04-02', 8, 20, 8)];
    expect(progressLine(all, START, '2026-04-30T12:00:00Z', TZ)).toBeNull();
    expect(progressLine(all, START, '2026-05-02T12:00:00Z', TZ)).not.toBeNull();
  });

  it('is null with fewer than 3 rides in either month', () => {
    expect(progressLine([...rides('2026-03-03', 2, 12, 8), ...rides('2026-06-05', 10, 24, 8)], START, NOW, TZ)).toBeNull();
    expect(progressLine([...rides('2026-03-03', 8, 12, 8), ...rides('2026-06-20', 2, 24, 8)], START, NOW, TZ)).toBeNull();
  });

  it('uses the singular for one minute', () => {
    const line = progressLine([...rides('2026-03-03', 3, 1, null), ...rides('2026-06-05', 3, 1, null)], START, NOW, TZ);
    expect(line).toBe('Over the past month your sessions averaged 1 active minute, about the same as in your first month.');
  });
});
