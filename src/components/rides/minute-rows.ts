// The numbers behind a session chart, one row per minute, for the table that
// screen-reader users (and anyone who prefers numbers) read instead of the chart.
import type { ChartSeries, Point } from './types';

type Phase = ChartSeries['phases'][number]['phase'];

export interface MinuteRow {
  /** Minutes from the start of the session to the start of this row's minute. */
  minute: number;
  /** The phase that covers most of the minute. */
  phase: Phase | null;
  /** Mean of each series' plotted points inside the minute, in the order given; null without points. */
  values: (number | null)[];
}

/** The phase runs as half-open ranges that meet: a run lasts until the next one begins. */
export function phaseRanges(phases: ChartSeries['phases']): { phase: Phase; from: number; to: number }[] {
  return phases.map((p, i) => ({ phase: p.phase, from: p.fromS, to: i + 1 < phases.length ? phases[i + 1].fromS : p.toS }));
}

export function minuteRows(phases: ChartSeries['phases'], series: Point[][], endS: number): MinuteRow[] {
  const ranges = phaseRanges(phases);
  const count = Math.max(1, Math.ceil(endS / 60));
  const rows: MinuteRow[] = [];
  for (let m = 0; m < count; m++) {
    const from = m * 60;
    const to = from + 60;
    let phase: Phase | null = null;
    let longest = 0;
    for (const r of ranges) {
      const overlap = Math.min(to, r.to) - Math.max(from, r.from);
      if (overlap > longest) {
        longest = overlap;
        phase = r.phase;
      }
    }
    // A one-sample run (or the final instant) has no length but still names the phase.
    phase ??= (ranges.find((r) => r.from >= from && r.from < to) ?? ranges.find((r) => r.from <= from && r.to >= from))?.phase ?? null;
    const values = series.map((points) => {
      let sum = 0;
      let n = 0;
      for (const [t, v] of points) {
        if (t >= from && (t < to || (m === count - 1 && t <= to))) {
          sum += v;
          n++;
        }
      }
      return n ? sum / n : null;
    });
    rows.push({ minute: m, phase, values });
  }
  return rows;
}
