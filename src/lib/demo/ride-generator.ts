// Plausible samples of one demo session (invented numbers): a motor-driven
// warm-up, a stimulated phase and a motor-driven cool-down, with seeded noise
// so that the same spec and seed always give the same ride.
import { DEFAULT_METRES_PER_REV } from '../rides/metrics';
import type { NAMED_CHANNELS, Phase } from '../rides/types';
import { mulberry32, normal, type Random } from './prng';

export type NamedChannel = (typeof NAMED_CHANNELS)[number];

export interface RideSpec {
  /** ISO 8601 instant, written with the local UTC offset the cycle shows (layouts with a start line print it as given). */
  startedAt: string;
  warmupMin: number;
  activeMin: number;
  cooldownMin: number;
  /** Time-weighted mean power over the active phase. */
  meanPowerW: number;
  cadenceRpm: number;
  /** Current each stimulated channel settles at once ramped up, mA. */
  currents: Partial<Record<NamedChannel, number>>;
  pulseWidthUs: number;
  frequencyHz: number;
  /** Samples per second. */
  hz: number;
  restingHeartRateBpm?: number;
  /** Printed by layouts whose cycle names itself in the file. */
  deviceSerial?: string;
}

/** Samples in canonical units, one entry per row the cycle would write. */
export interface GeneratedRide {
  spec: RideSpec;
  startedAtMs: number;
  /** Seconds from the first sample. */
  t: Float64Array;
  phase: Phase[];
  cadenceRpm: Float64Array;
  powerW: Float64Array;
  distanceM: Float64Array;
  heartRateBpm: Float64Array;
  pulseWidthUs: Float64Array;
  frequencyHz: Float64Array;
  currentsMa: Partial<Record<NamedChannel, Float64Array>>;
}

// Shape of the stimulated phase: the stimulator ramps each channel up from a
// tenth of its current over the first minute; after 60 % of the phase the
// muscles tire, power falls by up to 15 % and the stimulator adds up to 5 %
// current to hold cadence.
const RAMP_S = 60;
const RAMP_FROM = 0.1;
const FATIGUE_FROM = 0.6;
const FATIGUE_POWER_LOSS = 0.15;
const FATIGUE_CURRENT_GAIN = 0.05;
// The motor turns the legs a little slower in the cool-down than in the warm-up.
const COOLDOWN_CADENCE_DROP_RPM = 5;
const CADENCE_SPREAD_RPM = 5;
const DEFAULT_RESTING_HR_BPM = 72;
const HR_PER_WATT = 0.7;
const HR_DRIFT_BPM = 5;
const HR_LAG_S = 45;

interface Timeline {
  n: number;
  dt: number;
  activeFrom: number;
  activeTo: number;
}

function timelineOf(spec: RideSpec): Timeline {
  const { hz } = spec;
  if (!(hz > 0)) throw new RangeError(`Samples per second must be positive, not ${hz}`);
  for (const m of [spec.warmupMin, spec.activeMin, spec.cooldownMin]) {
    if (!(m >= 0)) throw new RangeError(`Phase minutes must be zero or more, not ${m}`);
  }
  const activeFrom = Math.round(spec.warmupMin * 60 * hz);
  const activeTo = activeFrom + Math.round(spec.activeMin * 60 * hz);
  const n = activeTo + Math.round(spec.cooldownMin * 60 * hz);
  if (n === 0) throw new RangeError('A ride needs at least one sample');
  return { n, dt: 1 / hz, activeFrom, activeTo };
}

/** Mean-reverting noise (Ornstein–Uhlenbeck) with spread `sigma` and memory `tauS`, the same whatever the sample rate. */
function wander(random: Random, n: number, dt: number, sigma: number, tauS: number): Float64Array {
  const keep = Math.exp(-dt / tauS);
  const kick = sigma * Math.sqrt(1 - keep * keep);
  const out = new Float64Array(n);
  let x = sigma * normal(random);
  for (let k = 0; k < n; k++) {
    out[k] = x;
    x = x * keep + kick * normal(random);
  }
  return out;
}

/** How far the stimulated phase has come: the current ramp (0.1 → 1) and fatigue (0 → 1). */
function activeShape(tl: Timeline, k: number): { ramp: number; fatigue: number } {
  const s = (k - tl.activeFrom) * tl.dt;
  const u = (k - tl.activeFrom) / (tl.activeTo - tl.activeFrom);
  return {
    ramp: s >= RAMP_S ? 1 : RAMP_FROM + ((1 - RAMP_FROM) * s) / RAMP_S,
    fatigue: u <= FATIGUE_FROM ? 0 : (u - FATIGUE_FROM) / (1 - FATIGUE_FROM),
  };
}

function phasesOf(tl: Timeline): Phase[] {
  const phase = new Array<Phase>(tl.n);
  for (let k = 0; k < tl.n; k++) phase[k] = k < tl.activeFrom ? 'passive' : k < tl.activeTo ? 'active' : 'cooldown';
  return phase;
}

function cadenceOf(spec: RideSpec, tl: Timeline, random: Random): Float64Array {
  const motor = wander(random, tl.n, tl.dt, 0.3, 10);
  const pedalling = wander(random, tl.n, tl.dt, 1.5, 15);
  const out = new Float64Array(tl.n);
  for (let k = 0; k < tl.n; k++) {
    if (k < tl.activeFrom) out[k] = spec.cadenceRpm + motor[k];
    else if (k < tl.activeTo) out[k] = spec.cadenceRpm + Math.max(-CADENCE_SPREAD_RPM, Math.min(CADENCE_SPREAD_RPM, pedalling[k]));
    else out[k] = spec.cadenceRpm - COOLDOWN_CADENCE_DROP_RPM + motor[k];
  }
  return out;
}

/** Active power scaled so that its mean is the spec's exactly; 0–2 W while the motor turns the legs. */
function powerOf(spec: RideSpec, tl: Timeline, random: Random): Float64Array {
  const noise = wander(random, tl.n, tl.dt, 0.06, 20);
  const out = new Float64Array(tl.n);
  let sum = 0;
  for (let k = tl.activeFrom; k < tl.activeTo; k++) {
    const { ramp, fatigue } = activeShape(tl, k);
    out[k] = Math.max(0, ramp * (1 - FATIGUE_POWER_LOSS * fatigue) * (1 + noise[k]));
    sum += out[k];
  }
  const scale = sum > 0 ? (spec.meanPowerW * (tl.activeTo - tl.activeFrom)) / sum : 0;
  for (let k = tl.activeFrom; k < tl.activeTo; k++) out[k] *= scale;
  for (let k = 0; k < tl.activeFrom; k++) out[k] = Math.min(2, Math.max(0, 0.8 + noise[k] * 8));
  for (let k = tl.activeTo; k < tl.n; k++) out[k] = Math.min(1, Math.max(0, 0.4 + noise[k] * 5));
  return out;
}

/** Zero outside the stimulated phase, so a file without a phase column still shows where stimulation ran. */
function currentOf(plateauMa: number, tl: Timeline, random: Random): Float64Array {
  const noise = wander(random, tl.n, tl.dt, 0.02, 30);
  const out = new Float64Array(tl.n);
  for (let k = tl.activeFrom; k < tl.activeTo; k++) {
    const { ramp, fatigue } = activeShape(tl, k);
    out[k] = plateauMa * ramp * (1 + FATIGUE_CURRENT_GAIN * fatigue) * (1 + noise[k]);
  }
  return out;
}

/** Set values while stimulating, 0 while the stimulator is off. */
function stimulationSetting(value: number, tl: Timeline): Float64Array {
  const out = new Float64Array(tl.n);
  out.fill(value, tl.activeFrom, tl.activeTo);
  return out;
}

/** Follows power with a lag and drifts up while stimulated. */
function heartRateOf(spec: RideSpec, tl: Timeline, power: Float64Array, random: Random): Float64Array {
  const rest = spec.restingHeartRateBpm ?? DEFAULT_RESTING_HR_BPM;
  const noise = wander(random, tl.n, tl.dt, 1.5, 20);
  const follow = 1 - Math.exp(-tl.dt / HR_LAG_S);
  const out = new Float64Array(tl.n);
  let load = 0;
  for (let k = 0; k < tl.n; k++) {
    const drift = k < tl.activeFrom ? 0 : k < tl.activeTo ? activeShape(tl, k).fatigue : 1 - (k - tl.activeTo) / (tl.n - tl.activeTo);
    const target = HR_PER_WATT * power[k] + HR_DRIFT_BPM * drift;
    load += (target - load) * follow;
    out[k] = rest + load + noise[k];
  }
  return out;
}

/** Distance the cycle counts from crank turns, at Kinloop's default metres per revolution. */
function distanceOf(cadence: Float64Array, dt: number): Float64Array {
  const out = new Float64Array(cadence.length);
  for (let k = 1; k < cadence.length; k++) out[k] = out[k - 1] + (cadence[k - 1] / 60) * dt * DEFAULT_METRES_PER_REV;
  return out;
}

export function generateRide(spec: RideSpec, seed: number): GeneratedRide {
  const startedAtMs = Date.parse(spec.startedAt);
  if (!Number.isFinite(startedAtMs)) throw new RangeError(`Not an ISO 8601 instant: ${spec.startedAt}`);
  const tl = timelineOf(spec);
  const random = mulberry32(seed);
  const t = new Float64Array(tl.n);
  for (let k = 0; k < tl.n; k++) t[k] = k * tl.dt;
  const cadenceRpm = cadenceOf(spec, tl, random);
  const powerW = powerOf(spec, tl, random);
  const currentsMa: GeneratedRide['currentsMa'] = {};
  for (const [channel, plateau] of Object.entries(spec.currents) as [NamedChannel, number][]) {
    currentsMa[channel] = currentOf(plateau, tl, random);
  }
  return {
    spec,
    startedAtMs,
    t,
    phase: phasesOf(tl),
    cadenceRpm,
    powerW,
    distanceM: distanceOf(cadenceRpm, tl.dt),
    heartRateBpm: heartRateOf(spec, tl, powerW, random),
    pulseWidthUs: stimulationSetting(spec.pulseWidthUs, tl),
    frequencyHz: stimulationSetting(spec.frequencyHz, tl),
    currentsMa,
  };
}
