// The canonical ride summary (PRODUCT.md, "Canonical ride metrics") from a
// series in canonical units. Shared by the parser, the demo generator and tests.

import { median } from '../analytics/median';
import { roundTo } from '../analytics/round';
import { deltas, TIME_TOLERANCE_S } from './deltas';
import { NAMED_CHANNELS, NUMBERED_CHANNELS, type ChannelName, type ChannelSummary, type RideSeries, type RideSummary } from './types';

export const DEFAULT_METRES_PER_REV = 2.0;
export const PEAK_WINDOW_S = 5;
/** meanPowerW below this gives no current-per-watt ratio. */
export const MIN_POWER_FOR_RATIO_W = 0.5;

/** Summary fields in the order PRODUCT.md lists them (the CLI prints them so). */
export const SUMMARY_FIELDS = [
  'startedAt',
  'durationS',
  'activeS',
  'passiveS',
  'cooldownS',
  'meanPowerW',
  'meanCadenceRpm',
  'peakPower5sW',
  'workKj',
  'distanceM',
  'channels',
  'currentPerWattMaPerW',
  'pulseWidthUs',
  'frequencyHz',
  'samples',
  'warnings',
] as const satisfies readonly (keyof RideSummary)[];

/**
 * Decimal places of each summary number: 0.1 s, 0.1 W, 0.1 rpm, 0.001 kJ,
 * 0.1 m, 0.1 mA, 0.001 mA/W, 0.1 µs, 0.1 Hz. Rounding is half away from zero.
 */
export const DECIMALS = {
  seconds: 1,
  watts: 1,
  rpm: 1,
  kilojoules: 3,
  metres: 1,
  milliamperes: 1,
  milliamperesPerWatt: 3,
  microseconds: 1,
  hertz: 1,
} as const;

// A distance column of astronomically large values can overflow last − first.
const roundOrNull = (value: number | null, decimals: number) => (value === null || !Number.isFinite(value) ? null : roundTo(value, decimals));

export interface SummariseOptions {
  /** Metres per crank revolution for distance from cadence; default 2.0. */
  metresPerRev?: number;
  startedAt?: string | null;
  warnings?: string[];
}

/** Time-weighted mean of the finite values of the masked samples; null when they weigh nothing. */
function weightedMean(values: Float64Array, d: Float64Array, mask: Uint8Array): number | null {
  let sum = 0;
  let weight = 0;
  for (let k = 0; k < values.length; k++) {
    const v = values[k];
    if (mask[k] === 1 && v === v) {
      sum += v * d[k];
      weight += d[k];
    }
  }
  return weight > 0 ? sum / weight : null;
}

function maskedMedian(values: Float64Array, mask: Uint8Array): number | null {
  const picked: number[] = [];
  for (let k = 0; k < values.length; k++) if (mask[k] === 1 && values[k] === values[k]) picked.push(values[k]);
  return median(picked);
}

function maximum(values: Float64Array): number | null {
  let best = -Infinity;
  for (let k = 0; k < values.length; k++) if (values[k] > best) best = values[k];
  return best === -Infinity ? null : best;
}

/**
 * Highest time-weighted mean power over a window [t, t + 5 s) that starts at
 * an active sample and holds ≥ 5 s of active Δ (active samples with a power
 * value). Prefix sums and a second pointer keep it O(n).
 */
function peakPower(t: Float64Array, power: Float64Array, d: Float64Array, active: Uint8Array): number | null {
  const n = t.length;
  const weight = new Float64Array(n + 1);
  const energy = new Float64Array(n + 1);
  for (let k = 0; k < n; k++) {
    const counts = active[k] === 1 && power[k] === power[k];
    weight[k + 1] = weight[k] + (counts ? d[k] : 0);
    energy[k + 1] = energy[k] + (counts ? power[k] * d[k] : 0);
  }
  let best = -Infinity;
  let bestStart = -1;
  let bestStop = -1;
  let j = 0;
  for (let i = 0; i < n; i++) {
    if (active[i] !== 1) continue;
    if (j < i) j = i;
    const stop = t[i] + PEAK_WINDOW_S - TIME_TOLERANCE_S;
    while (j < n && t[j] < stop) j++;
    const w = weight[j] - weight[i];
    if (w >= PEAK_WINDOW_S - TIME_TOLERANCE_S) {
      const mean = (energy[j] - energy[i]) / w;
      if (mean > best) {
        best = mean;
        bestStart = i;
        bestStop = j;
      }
    }
  }
  if (bestStart < 0) return null;
  // Differences of long prefix sums carry rounding noise; the winning window is summed again directly.
  let sum = 0;
  let w = 0;
  for (let k = bestStart; k < bestStop; k++) {
    if (active[k] === 1 && power[k] === power[k]) {
      sum += power[k] * d[k];
      w += d[k];
    }
  }
  return sum / w;
}

function work(power: Float64Array, d: Float64Array): number | null {
  let joules = 0;
  let any = false;
  for (let k = 0; k < power.length; k++) {
    const p = power[k];
    if (p !== p) continue;
    any = true;
    if (p > 0) joules += p * d[k];
  }
  return any ? joules / 1000 : null;
}

function distanceFromColumn(distance: Float64Array): number | null {
  let first = NaN;
  let last = NaN;
  for (let k = 0; k < distance.length; k++) {
    if (distance[k] !== distance[k]) continue;
    if (first !== first) first = distance[k];
    last = distance[k];
  }
  return first === first ? last - first : null;
}

function distanceFromCadence(cadence: Float64Array, d: Float64Array, metresPerRev: number): number | null {
  let revolutions = 0;
  let any = false;
  for (let k = 0; k < cadence.length; k++) {
    const c = cadence[k];
    if (c !== c) continue;
    any = true;
    revolutions += (c / 60) * d[k];
  }
  return any ? revolutions * metresPerRev : null;
}

/**
 * The canonical summary of a series whose `t` is strictly increasing from 0.
 * A distance column (series.distanceM) wins over distance from cadence; a
 * distance column without any value falls back to cadence.
 */
export function summarise(series: RideSeries, options: SummariseOptions = {}): RideSummary {
  const { t, phase } = series;
  const n = t.length;
  const d = deltas(t);
  const active = new Uint8Array(n);
  let durationS = 0;
  const byPhase = { active: 0, passive: 0, cooldown: 0 };
  for (let k = 0; k < n; k++) {
    durationS += d[k];
    byPhase[phase[k]] += d[k];
    if (phase[k] === 'active') active[k] = 1;
  }
  const metresPerRev = options.metresPerRev ?? DEFAULT_METRES_PER_REV;
  const meanPowerW = series.powerW ? weightedMean(series.powerW, d, active) : null;
  const channels: Partial<Record<ChannelName, ChannelSummary>> = {};
  const raw: { name: ChannelName; mean: number | null; max: number | null }[] = [];
  for (const name of [...NAMED_CHANNELS, ...NUMBERED_CHANNELS]) {
    const values = series.channels[name];
    if (!values) continue;
    raw.push({ name, mean: weightedMean(values, d, active), max: maximum(values) });
  }
  const means = raw.map((c) => c.mean).filter((m): m is number => m !== null);
  for (const c of raw) {
    channels[c.name] = { meanCurrentMa: roundOrNull(c.mean, DECIMALS.milliamperes), maxCurrentMa: roundOrNull(c.max, DECIMALS.milliamperes) };
  }
  const ratio =
    meanPowerW !== null && meanPowerW >= MIN_POWER_FOR_RATIO_W && means.length > 0 ? means.reduce((a, b) => a + b, 0) / meanPowerW : null;
  const fromColumn = series.distanceM ? distanceFromColumn(series.distanceM) : null;
  const distanceM = fromColumn ?? (series.cadenceRpm ? distanceFromCadence(series.cadenceRpm, d, metresPerRev) : null);

  return {
    startedAt: options.startedAt ?? null,
    durationS: roundTo(durationS, DECIMALS.seconds),
    activeS: roundTo(byPhase.active, DECIMALS.seconds),
    passiveS: roundTo(byPhase.passive, DECIMALS.seconds),
    cooldownS: roundTo(byPhase.cooldown, DECIMALS.seconds),
    meanPowerW: roundOrNull(meanPowerW, DECIMALS.watts),
    meanCadenceRpm: roundOrNull(series.cadenceRpm ? weightedMean(series.cadenceRpm, d, active) : null, DECIMALS.rpm),
    peakPower5sW: roundOrNull(series.powerW ? peakPower(t, series.powerW, d, active) : null, DECIMALS.watts),
    workKj: roundOrNull(series.powerW ? work(series.powerW, d) : null, DECIMALS.kilojoules),
    distanceM: roundOrNull(distanceM, DECIMALS.metres),
    channels,
    currentPerWattMaPerW: roundOrNull(ratio, DECIMALS.milliamperesPerWatt),
    pulseWidthUs: roundOrNull(series.pulseWidthUs ? maskedMedian(series.pulseWidthUs, active) : null, DECIMALS.microseconds),
    frequencyHz: roundOrNull(series.frequencyHz ? maskedMedian(series.frequencyHz, active) : null, DECIMALS.hertz),
    samples: n,
    warnings: options.warnings ?? [],
  };
}
