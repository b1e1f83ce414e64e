// Session summaries for the scale population. The sampled sessions get the
// real thing: the demo's generator writes the samples and Kinloop's own
// metrics summarise them. Generating all 300,000 would take most of an hour on
// two cores, so the other sessions get a summary scaled from one reference
// ride that the same generator and metrics produced: the ratios (5-s peak to
// mean power, channel mean and maximum to the plateau, motor-driven power,
// cadence offset) are the generator's, measured once per seed run.
import { generateRide, type GeneratedRide, type RideSpec } from '../../../src/lib/demo/ride-generator';
import { roundTo } from '../../../src/lib/analytics/round';
import { DECIMALS, DEFAULT_METRES_PER_REV, MIN_POWER_FOR_RATIO_W, summarise } from '../../../src/lib/rides/metrics';
import type { ChannelName, RideSeries, RideSummary } from '../../../src/lib/rides/types';
import { normal, type Random } from '../../../src/lib/demo/prng';

export function seriesOf(g: GeneratedRide): RideSeries {
  return {
    t: g.t,
    phase: g.phase,
    cadenceRpm: g.cadenceRpm,
    powerW: g.powerW,
    distanceM: g.distanceM,
    heartRateBpm: g.heartRateBpm,
    pulseWidthUs: g.pulseWidthUs,
    frequencyHz: g.frequencyHz,
    channels: g.currentsMa,
  };
}

export interface SummaryModel {
  peakToMean: number;
  /** Mean power while the motor turns the legs (warm-up and cool-down), W. */
  motorW: number;
  cadenceShiftRpm: number;
  channelMeanToPlateau: number;
  channelMaxToPlateau: number;
}

const REFERENCE: RideSpec = {
  startedAt: '2026-01-05T10:00:00Z',
  warmupMin: 5,
  activeMin: 36,
  cooldownMin: 4,
  meanPowerW: 24,
  cadenceRpm: 42,
  currents: { quadriceps_left: 100, quadriceps_right: 100 },
  pulseWidthUs: 300,
  frequencyHz: 35,
  hz: 1,
};

export function calibrate(): SummaryModel {
  const s = summarise(seriesOf(generateRide(REFERENCE, 1)));
  const activeKj = (REFERENCE.meanPowerW * s.activeS) / 1000;
  const motorKj = s.workKj! - activeKj;
  const plateau = REFERENCE.currents.quadriceps_left!;
  const ch = Object.values(s.channels);
  return {
    peakToMean: s.peakPower5sW! / s.meanPowerW!,
    motorW: (motorKj * 1000) / (s.passiveS + s.cooldownS),
    cadenceShiftRpm: s.meanCadenceRpm! - REFERENCE.cadenceRpm,
    channelMeanToPlateau: ch.reduce((a, c) => a + c!.meanCurrentMa!, 0) / ch.length / plateau,
    channelMaxToPlateau: ch.reduce((a, c) => a + c!.maxCurrentMa!, 0) / ch.length / plateau,
  };
}

/** A plausible summary of `spec` without generating its samples; ±2 % noise on the ratios. */
export function modelSummary(spec: RideSpec, m: SummaryModel, random: Random): RideSummary {
  const jitter = () => 1 + 0.02 * (normal(random) / 1.7);
  const passiveS = spec.warmupMin * 60;
  const activeS = spec.activeMin * 60;
  const cooldownS = spec.cooldownMin * 60;
  const channels: RideSummary['channels'] = {};
  let sumMeans = 0;
  for (const [name, plateau] of Object.entries(spec.currents) as [ChannelName, number][]) {
    const mean = roundTo(plateau * m.channelMeanToPlateau * jitter(), DECIMALS.milliamperes);
    channels[name] = { meanCurrentMa: mean, maxCurrentMa: roundTo(Math.max(mean, plateau * m.channelMaxToPlateau * jitter()), DECIMALS.milliamperes) };
    sumMeans += mean;
  }
  const distance = ((spec.cadenceRpm * (spec.warmupMin + spec.activeMin) + (spec.cadenceRpm - 5) * spec.cooldownMin) * DEFAULT_METRES_PER_REV);
  const meanPowerW = roundTo(spec.meanPowerW, DECIMALS.watts);
  return {
    startedAt: spec.startedAt,
    durationS: passiveS + activeS + cooldownS,
    activeS,
    passiveS,
    cooldownS,
    distanceM: roundTo(distance * jitter(), DECIMALS.metres),
    meanPowerW,
    peakPower5sW: roundTo(spec.meanPowerW * m.peakToMean * jitter(), DECIMALS.watts),
    workKj: roundTo((spec.meanPowerW * activeS + m.motorW * (passiveS + cooldownS)) / 1000, DECIMALS.kilojoules),
    meanCadenceRpm: roundTo(spec.cadenceRpm + m.cadenceShiftRpm, DECIMALS.rpm),
    currentPerWattMaPerW: meanPowerW >= MIN_POWER_FOR_RATIO_W && sumMeans > 0 ? roundTo(sumMeans / meanPowerW, DECIMALS.milliamperesPerWatt) : null,
    channels,
    pulseWidthUs: spec.pulseWidthUs,
    frequencyHz: spec.frequencyHz,
    samples: Math.round((passiveS + activeS + cooldownS) * spec.hz),
    warnings: [],
  };
}
