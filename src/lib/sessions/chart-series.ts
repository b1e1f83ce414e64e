import { LTTB } from 'downsample';
import type { Phase, RideSeries } from '../rides/types';

export type Point = [number, number];

export interface ChartSeries {
  samples: number;
  downsampled: boolean;
  phases: { phase: Phase; fromS: number; toS: number }[];
  cadenceRpm?: Point[];
  powerW?: Point[];
  heartRateBpm?: Point[];
  pulseWidthUs?: Point[];
  frequencyHz?: Point[];
  distanceM?: Point[];
  channels: Record<string, Point[]>;
}

function points(t: Float64Array, values: Float64Array, max: number | null): Point[] {
  const out: Point[] = [];
  for (let i = 0; i < t.length; i++) if (!Number.isNaN(values[i])) out.push([t[i], values[i]]);
  // Largest-triangle-three-buckets keeps the peaks and dips a chart must show.
  return max && out.length > max ? (LTTB(out, max) as Point[]) : out;
}

/** Phase runs as time ranges: exact at any resolution, and tiny. */
export function phaseRuns(series: RideSeries): ChartSeries['phases'] {
  const runs: ChartSeries['phases'] = [];
  for (let i = 0; i < series.t.length; i++) {
    const last = runs[runs.length - 1];
    if (last && last.phase === series.phase[i]) last.toS = series.t[i];
    else runs.push({ phase: series.phase[i], fromS: series.t[i], toS: series.t[i] });
  }
  return runs;
}

/** The series as [t, value] pairs per field, reduced to at most `maxPoints` per field when asked. */
export function chartSeries(series: RideSeries, maxPoints: number | null): ChartSeries {
  const out: ChartSeries = {
    samples: series.t.length,
    downsampled: maxPoints !== null && series.t.length > maxPoints,
    phases: phaseRuns(series),
    channels: {},
  };
  for (const key of ['cadenceRpm', 'powerW', 'heartRateBpm', 'pulseWidthUs', 'frequencyHz', 'distanceM'] as const) {
    const values = series[key];
    if (values) out[key] = points(series.t, values, maxPoints);
  }
  for (const [name, values] of Object.entries(series.channels)) {
    if (values) out.channels[name] = points(series.t, values, maxPoints);
  }
  return out;
}
