// The demo program's rides, pauses and prescriptions: an invented story with
// invented numbers, dated relative to `now` so that the demo always looks
// current. Each client rides three times a week from the program start
// (scenario.ts `startedDaysAgo`) on their own weekdays and at their own time
// of day (in the week the program starts, also on its first days when their
// weekdays alone would leave that short week missed); sessions grow from about 25 to 45–55 minutes over the first month
// or so, mean power rises from a few watts towards 15–40 W, and currents
// settle at about 70 % of the prescribed maximum (300 µs, 35 Hz).
//
// Who shows what, with the clinic's default flag thresholds (the flags the
// files leave, whether they arrive week by week or all at once):
// - jonah, annika: steady progress, every week met; no flags.
// - mairi: rode nothing in the ISO week three weeks before the current one
//   (an MS relapse). The weeks since are met, so her streak is broken, the
//   week shows as missed in her history, and its missed_sessions flag (review)
//   stays cleared for the therapist: the condition no longer holds.
// - dev: his latest two sessions at about 42 % below his usual mean power →
//   power_drop, urgent. The intensity was turned down with it, so his current
//   per watt holds and power_drop is his only flag.
// - hollis: the same at 27 % below → power_drop, review.
// - kofi: his latest two sessions at his usual power with 30 % more current on
//   every channel → current_rise, review.
// - elsie: her latest two sessions lasted 25 and then 22 minutes, well under
//   80 % of her 45 prescribed minutes → short_session, info. Short sessions do not
//   count, so when one of them falls in the last finished week (now early in
//   the week) that week is also missed → missed_sessions, review.
// - rafael: a paused fortnight (holiday), the ISO weeks seven and six before
//   the current one, with no sessions in it; no flags.
// - noor: no session in the last 12 days → missed_sessions, urgent (no session).
// - wren: the program started 90 days ago but was paused until the loan cycle
//   arrived, up to the Sunday before last; a few sessions since, too few to
//   compare power or current with; no flags.
import { isoWeekOf } from '../time/iso-week';
import { addDays, daysFrom, localDate } from '../time/local-date';
import { between, integerBetween, mulberry32, seedOf } from './prng';
import type { NamedChannel, RideSpec } from './ride-generator';
import { RIDE_LAYOUTS, type LayoutKey } from './ride-layouts';
import { datesOnWeekdays, daysBefore, mondayWeeksBack } from './ride-schedule';
import { wallTime } from '../time/zoned';
import { DEMO_CLIENTS, type DemoClient } from './scenario';

export interface DemoRide {
  clientKey: string;
  layout: LayoutKey;
  spec: RideSpec;
  fileName: string;
  /** The seed to pass to generateRide with the spec. */
  seed: number;
}

export interface DemoPause {
  clientKey: string;
  /** Local dates, both inclusive. */
  from: string;
  to: string;
  reason: string;
}

export interface DemoChannelLimit {
  maxCurrentMa: number;
  pulseWidthUs: number;
  frequencyHz: number;
}

export interface DemoPrescription {
  /** Local date YYYY-MM-DD in the client's time zone. */
  effectiveFrom: string;
  sessionsPerWeek: number;
  minutesPerSession: number;
  warmupMinutes: number;
  targetCadenceRpm: number;
  cadenceToleranceRpm: number;
  resistance: number;
  channels: Partial<Record<NamedChannel, DemoChannelLimit>>;
  notes: string;
}

interface Story {
  layout: LayoutKey;
  serial?: string;
  /** ISO weekdays of the usual rides, 1 = Monday. */
  weekdays: number[];
  /** Usual local start, minutes after midnight. */
  startMinute: number;
  cadenceRpm: number;
  /** Resistance level of the first and the later prescription. */
  resistance: [number, number];
  maxCurrentsMa: Partial<Record<NamedChannel, number>>;
  power: { startW: number; topW: number; tauDays: number };
  /** Total session minutes the sessions grow to. */
  capMinutes: number;
  /** The later prescription: from which program day, how many minutes; null for none yet. */
  longer: { fromDay: number; minutes: number } | null;
  restingHeartRateBpm: number;
}

const six = (quad: number, ham: number, glute: number): Partial<Record<NamedChannel, number>> => ({
  quadriceps_left: quad,
  quadriceps_right: quad,
  hamstrings_left: ham,
  hamstrings_right: ham,
  gluteals_left: glute,
  gluteals_right: glute,
});
const four = (quad: number, ham: number): Partial<Record<NamedChannel, number>> => ({
  quadriceps_left: quad,
  quadriceps_right: quad,
  hamstrings_left: ham,
  hamstrings_right: ham,
});
const at = (hh: number, mm: number) => hh * 60 + mm;

const STORIES: Record<string, Story> = {
  jonah: { layout: 'A', serial: 'KBA-0417', weekdays: [1, 3, 5], startMinute: at(10, 0), cadenceRpm: 45, resistance: [1, 2], maxCurrentsMa: six(120, 110, 100), power: { startW: 3, topW: 20, tauDays: 55 }, capMinutes: 50, longer: { fromDay: 28, minutes: 45 }, restingHeartRateBpm: 62 },
  dev: { layout: 'A', serial: 'KBA-0388', weekdays: [2, 4, 6], startMinute: at(14, 30), cadenceRpm: 40, resistance: [1, 1], maxCurrentsMa: six(110, 100, 90), power: { startW: 2, topW: 15, tauDays: 60 }, capMinutes: 45, longer: { fromDay: 35, minutes: 40 }, restingHeartRateBpm: 58 },
  mairi: { layout: 'B', serial: 'DST-31806', weekdays: [1, 3, 6], startMinute: at(9, 30), cadenceRpm: 42, resistance: [1, 2], maxCurrentsMa: four(80, 70), power: { startW: 5, topW: 28, tauDays: 50 }, capMinutes: 45, longer: { fromDay: 28, minutes: 45 }, restingHeartRateBpm: 74 },
  hollis: { layout: 'B', serial: 'DST-31842', weekdays: [2, 4, 7], startMinute: at(11, 0), cadenceRpm: 42, resistance: [2, 3], maxCurrentsMa: four(70, 60), power: { startW: 6, topW: 38, tauDays: 50 }, capMinutes: 48, longer: { fromDay: 28, minutes: 45 }, restingHeartRateBpm: 70 },
  annika: { layout: 'C', weekdays: [1, 3, 5], startMinute: at(16, 30), cadenceRpm: 45, resistance: [2, 3], maxCurrentsMa: six(90, 80, 70), power: { startW: 6, topW: 35, tauDays: 45 }, capMinutes: 55, longer: { fromDay: 28, minutes: 45 }, restingHeartRateBpm: 68 },
  kofi: { layout: 'A', serial: 'KBA-0452', weekdays: [2, 4, 6], startMinute: at(10, 30), cadenceRpm: 42, resistance: [1, 2], maxCurrentsMa: six(120, 110, 100), power: { startW: 3, topW: 18, tauDays: 55 }, capMinutes: 50, longer: { fromDay: 28, minutes: 45 }, restingHeartRateBpm: 64 },
  elsie: { layout: 'B', serial: 'DST-31877', weekdays: [1, 3, 5], startMinute: at(9, 0), cadenceRpm: 40, resistance: [1, 2], maxCurrentsMa: four(70, 60), power: { startW: 4, topW: 22, tauDays: 50 }, capMinutes: 45, longer: { fromDay: 28, minutes: 45 }, restingHeartRateBpm: 76 },
  rafael: { layout: 'A', serial: 'KBA-0291', weekdays: [2, 5, 7], startMinute: at(15, 0), cadenceRpm: 45, resistance: [2, 3], maxCurrentsMa: six(80, 70, 60), power: { startW: 6, topW: 40, tauDays: 45 }, capMinutes: 55, longer: { fromDay: 42, minutes: 45 }, restingHeartRateBpm: 66 },
  wren: { layout: 'C', weekdays: [1, 3, 5], startMinute: at(13, 30), cadenceRpm: 43, resistance: [1, 2], maxCurrentsMa: four(90, 80), power: { startW: 5, topW: 30, tauDays: 50 }, capMinutes: 45, longer: null, restingHeartRateBpm: 70 },
  noor: { layout: 'C', weekdays: [2, 4, 6], startMinute: at(10, 0), cadenceRpm: 40, resistance: [1, 2], maxCurrentsMa: four(65, 60), power: { startW: 5, topW: 30, tauDays: 50 }, capMinutes: 45, longer: { fromDay: 28, minutes: 40 }, restingHeartRateBpm: 72 },
};

const LAYOUT_HZ: Record<LayoutKey, number> = { A: 1, B: 2, C: 1 };
const SESSIONS_PER_WEEK = 3;
const FIRST_PRESCRIBED_MINUTES = 30;
const WARMUP_MIN = 5;
const COOLDOWN_MIN = 4;
const CADENCE_TOLERANCE_RPM = 5;
const PULSE_WIDTH_US = 300;
const FREQUENCY_HZ = 35;
// Sessions start at 26 ± 1 minutes (at least 80 % of the first 30) and gain
// 0.6 min a day, so that they clear 80 % of the later 40–45 minutes from the
// 22nd day of riding on: before any later prescription starts (program day 28
// or later, and the first ride is at most six days after the program start).
const START_MINUTES = 26;
const MINUTES_PER_DAY = 0.6;
// Currents go from half to 70 % of the maximum over the first weeks, leaving
// room for the current rise in kofi's story.
const CURRENT_FROM = 0.5;
const CURRENT_TO = 0.7;
const CURRENT_TAU_DAYS = 21;
// Small enough that the story's power drops and current rise stay inside
// their flag bands whatever the neighbouring sessions did.
const DAY_TO_DAY_POWER = 0.02;

interface Context {
  key: string;
  story: Story;
  timeZone: string;
  now: Date;
  today: string;
  programStart: string;
}

interface Planned {
  date: string;
  /** Days since the client's first ride. */
  day: number;
  spec: RideSpec;
}

const round1 = (x: number) => Math.round(x * 10) / 10;

function storyOf(client: DemoClient): Story {
  const story = STORIES[client.key];
  if (!story) throw new Error(`The demo story has no rides for client "${client.key}"`);
  return story;
}

function contextOf(client: DemoClient, now: Date): Context {
  return {
    key: client.key,
    story: storyOf(client),
    timeZone: client.timeZone,
    now,
    today: localDate(now, client.timeZone),
    programStart: daysBefore(now, client.timeZone, client.startedDaysAgo),
  };
}

function trendPowerW(story: Story, day: number): number {
  const { startW, topW, tauDays } = story.power;
  return startW + (topW - startW) * (1 - Math.exp(-day / tauDays));
}

function currentsOn(story: Story, day: number): Partial<Record<NamedChannel, number>> {
  const level = CURRENT_FROM + (CURRENT_TO - CURRENT_FROM) * (1 - Math.exp(-day / CURRENT_TAU_DAYS));
  return scaleCurrents(story.maxCurrentsMa, level);
}

function scaleCurrents(currents: Partial<Record<NamedChannel, number>>, factor: number): Partial<Record<NamedChannel, number>> {
  return Object.fromEntries(Object.entries(currents).map(([c, v]) => [c, round1(v * factor)]));
}

function plannedRide(ctx: Context, date: string, day: number): Planned {
  const { story } = ctx;
  const random = mulberry32(seedOf(`${ctx.key}:${date}:day`));
  const startMinute = story.startMinute + 5 * integerBetween(random, -6, 6);
  const total = Math.min(story.capMinutes, Math.floor(START_MINUTES + MINUTES_PER_DAY * day)) + integerBetween(random, -1, 1);
  const spec: RideSpec = {
    startedAt: wallTime(date, startMinute, ctx.timeZone),
    warmupMin: WARMUP_MIN,
    activeMin: total - WARMUP_MIN - COOLDOWN_MIN,
    cooldownMin: COOLDOWN_MIN,
    meanPowerW: round1(trendPowerW(story, day) * (1 + between(random, -DAY_TO_DAY_POWER, DAY_TO_DAY_POWER))),
    cadenceRpm: story.cadenceRpm + integerBetween(random, -1, 1),
    currents: currentsOn(story, day),
    pulseWidthUs: PULSE_WIDTH_US,
    frequencyHz: FREQUENCY_HZ,
    hz: LAYOUT_HZ[story.layout],
    restingHeartRateBpm: story.restingHeartRateBpm,
    deviceSerial: story.serial,
  };
  return { date, day, spec };
}

const endMs = (spec: RideSpec) => Date.parse(spec.startedAt) + (spec.warmupMin + spec.activeMin + spec.cooldownMin) * 60_000;

type Pauser = (ctx: Context) => Omit<DemoPause, 'clientKey'>;
const PAUSES: Record<string, Pauser> = {
  rafael: (ctx) => ({
    from: mondayWeeksBack(ctx.now, ctx.timeZone, 7),
    to: addDays(mondayWeeksBack(ctx.now, ctx.timeZone, 6), 6),
    reason: 'Family holiday abroad',
  }),
  wren: (ctx) => ({
    from: ctx.programStart,
    to: addDays(mondayWeeksBack(ctx.now, ctx.timeZone, 1), -1),
    reason: 'Waiting for the loan cycle to be delivered',
  }),
};

function pauseOf(ctx: Context): Omit<DemoPause, 'clientKey'> | null {
  return PAUSES[ctx.key]?.(ctx) ?? null;
}

/** The latest `count` rides changed by `change`, the others kept. */
function lastRides(count: number, change: (ride: Planned) => RideSpec): (rides: Planned[]) => Planned[] {
  return (rides) => rides.map((r, i) => (i >= rides.length - count ? { ...r, spec: change(r) } : r));
}

function weaker(factor: number): (ride: Planned) => RideSpec {
  return ({ spec }) => ({ ...spec, meanPowerW: round1(spec.meanPowerW * factor), currents: scaleCurrents(spec.currents, factor) });
}

type Twist = (rides: Planned[], ctx: Context) => Planned[];
const TWISTS: Record<string, Twist> = {
  mairi: (rides, ctx) => {
    const monday = mondayWeeksBack(ctx.now, ctx.timeZone, 3);
    return rides.filter((r) => r.date < monday || r.date > addDays(monday, 6));
  },
  dev: lastRides(2, weaker(0.58)),
  hollis: lastRides(2, weaker(0.73)),
  kofi: (rides, ctx) =>
    lastRides(2, ({ spec, day }) => ({ ...spec, meanPowerW: round1(trendPowerW(ctx.story, day)), currents: scaleCurrents(spec.currents, 1.3) }))(rides),
  elsie: (rides) => {
    const shortActive = [13, 16];
    return rides.map((r, i) => {
      const fromEnd = rides.length - 1 - i;
      return fromEnd < shortActive.length ? { ...r, spec: { ...r.spec, activeMin: shortActive[fromEnd] } } : r;
    });
  },
  noor: (rides, ctx) => rides.filter((r) => r.date <= addDays(ctx.today, -12)),
};

/**
 * The usual weekdays from the program start, plus, in the week the program
 * starts, its first other days when the usual ones leave that week short of
 * its prorated target (3 × the week's program days / 7, rounded up): the story's
 * riders meet every week, the first one included.
 */
function rideDates(ctx: Context): string[] {
  const usual = datesOnWeekdays(ctx.programStart, ctx.today, ctx.story.weekdays);
  const sunday = isoWeekOf(ctx.programStart, ctx.timeZone).sunday;
  const firstWeek = datesOnWeekdays(ctx.programStart, sunday < ctx.today ? sunday : ctx.today, [1, 2, 3, 4, 5, 6, 7]);
  const target = Math.ceil((SESSIONS_PER_WEEK * (daysFrom(ctx.programStart, sunday) + 1)) / 7);
  const extra = firstWeek.filter((d) => !usual.includes(d)).slice(0, Math.max(0, target - usual.filter((d) => d <= sunday).length));
  return [...usual, ...extra].sort();
}

function clientRides(ctx: Context): Planned[] {
  const pause = pauseOf(ctx);
  const dates = rideDates(ctx).filter((d) => pause === null || d < pause.from || d > pause.to);
  if (dates.length === 0) return [];
  const rides = dates.map((date) => plannedRide(ctx, date, daysFrom(dates[0], date))).filter((r) => endMs(r.spec) <= ctx.now.getTime());
  return TWISTS[ctx.key]?.(rides, ctx) ?? rides;
}

/** Every demo ride file to generate, per client oldest first. */
export function demoRidePlan(now: Date): DemoRide[] {
  return DEMO_CLIENTS.flatMap((client) => {
    const ctx = contextOf(client, now);
    return clientRides(ctx).map((r) => ({
      clientKey: client.key,
      layout: ctx.story.layout,
      spec: r.spec,
      fileName: RIDE_LAYOUTS[ctx.story.layout].fileName(r.spec),
      seed: seedOf(`${client.key}:${r.date}:ride`),
    }));
  });
}

export function demoPauses(now: Date): DemoPause[] {
  return DEMO_CLIENTS.flatMap((client) => {
    const pause = pauseOf(contextOf(client, now));
    return pause === null ? [] : [{ clientKey: client.key, ...pause }];
  });
}

function channelLimits(story: Story): Partial<Record<NamedChannel, DemoChannelLimit>> {
  return Object.fromEntries(
    Object.entries(story.maxCurrentsMa).map(([c, maxCurrentMa]) => [c, { maxCurrentMa, pulseWidthUs: PULSE_WIDTH_US, frequencyHz: FREQUENCY_HZ }]),
  );
}

/** Prescription versions per client key, oldest first; the first is effective from the program start. */
export function demoPrescriptions(now: Date): Record<string, DemoPrescription[]> {
  return Object.fromEntries(
    DEMO_CLIENTS.map((client) => {
      const ctx = contextOf(client, now);
      const { story } = ctx;
      const first: DemoPrescription = {
        effectiveFrom: ctx.programStart,
        sessionsPerWeek: SESSIONS_PER_WEEK,
        minutesPerSession: FIRST_PRESCRIBED_MINUTES,
        warmupMinutes: WARMUP_MIN,
        targetCadenceRpm: story.cadenceRpm,
        cadenceToleranceRpm: CADENCE_TOLERANCE_RPM,
        resistance: story.resistance[0],
        channels: channelLimits(story),
        notes: 'First weeks: build up from about 25 minutes as tolerated, warm-up included.',
      };
      const versions = [first];
      const from = story.longer ? addDays(ctx.programStart, story.longer.fromDay) : null;
      if (story.longer && from !== null && from <= ctx.today) {
        versions.push({
          ...first,
          effectiveFrom: from,
          minutesPerSession: story.longer.minutes,
          resistance: story.resistance[1],
          notes: `Sessions lengthened to ${story.longer.minutes} minutes now that ${FIRST_PRESCRIBED_MINUTES} are well tolerated; resistance level ${story.resistance[1]}.`,
        });
      }
      return [client.key, versions];
    }),
  );
}
