// The demo story (invented numbers): every element the comment at the top of
// ride-story.ts promises is in the plan, on any weekday of `now`.
import { median } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { demoPauses, demoPrescriptions, demoRidePlan, type DemoPrescription, type DemoRide } from '../../../src/lib/demo/ride-story';
import { DEMO_CLIENTS } from '../../../src/lib/demo/scenario';
import type { FlagSession } from '../../../src/lib/flags';
import {
  daysAgo,
  ELSIE_WEEK_MISSED,
  expectedFlags,
  flagsOf,
  isoWeekday,
  isoWeekKey,
  labels,
  localDay,
  localMinute,
  NOWS,
  plusDays,
} from './story-checks';

const zoneOf = (key: string) => DEMO_CLIENTS.find((c) => c.key === key)!.timeZone;
const minutesOf = (r: DemoRide) => r.spec.warmupMin + r.spec.activeMin + r.spec.cooldownMin;
const currentSum = (r: DemoRide) => Object.values(r.spec.currents).reduce((a, b) => a + b!, 0);
const versionOn = (versions: DemoPrescription[], day: string) => versions.filter((v) => v.effectiveFrom <= day).at(-1)!;

/** A session as the flags see it, with the metrics the spec asks the cycle for. */
function sessionOf(r: DemoRide, i: number): FlagSession {
  return {
    id: `${r.clientKey}-${i}`,
    startedAt: new Date(Date.parse(r.spec.startedAt)).toISOString(),
    durationS: minutesOf(r) * 60,
    meanPowerW: r.spec.meanPowerW,
    currentPerWattMaPerW: currentSum(r) / r.spec.meanPowerW,
  };
}

describe.each(NOWS)('the demo story as of %s', (nowIso) => {
  const now = new Date(nowIso);
  const plan = demoRidePlan(now);
  const pauses = demoPauses(now);
  const prescriptions = demoPrescriptions(now);
  const ridesOf = (key: string) => plan.filter((r) => r.clientKey === key);
  const todayOf = (key: string) => localDay(now, zoneOf(key));
  const dayOf = (r: DemoRide) => localDay(r.spec.startedAt, zoneOf(r.clientKey));
  const weekOf = (key: string, weeksBack: number) => isoWeekKey(plusDays(todayOf(key), -7 * weeksBack));

  it('leaves the flags the story promises, and no others', () => {
    for (const c of DEMO_CLIENTS) {
      const flags = flagsOf(c.timeZone, now, prescriptions[c.key], pauses.filter((p) => p.clientKey === c.key), ridesOf(c.key).map(sessionOf));
      expect(labels(flags), c.key).toEqual(expectedFlags(c.key, nowIso));
    }
  });

  it('has elsie’s last finished week missed exactly when one of her short rides lies in it', () => {
    const lastWeek = weekOf('elsie', 1);
    expect(ridesOf('elsie').slice(-2).some((r) => isoWeekKey(dayOf(r)) === lastWeek)).toBe(ELSIE_WEEK_MISSED.has(nowIso));
  });

  it('has every client ride from the program start until now, at plausible local times', () => {
    expect(plan.length).toBeGreaterThan(450);
    expect(plan.length).toBeLessThan(900);
    for (const c of DEMO_CLIENTS) {
      const rides = ridesOf(c.key);
      expect(rides.length, c.key).toBeGreaterThanOrEqual(3);
      const start = prescriptions[c.key][0].effectiveFrom;
      for (const r of rides) {
        expect(dayOf(r) >= start, c.key).toBe(true);
        expect(Date.parse(r.spec.startedAt) + minutesOf(r) * 60_000).toBeLessThanOrEqual(now.getTime());
        const minute = localMinute(r.spec.startedAt, c.timeZone);
        expect(minute).toBeGreaterThanOrEqual(8 * 60);
        expect(minute).toBeLessThanOrEqual(18 * 60);
      }
      expect(new Set(rides.map((r) => r.fileName)).size, c.key).toBe(rides.length);
      expect(rides.map((r) => r.spec.startedAt)).toEqual([...rides.map((r) => r.spec.startedAt)].sort((a, b) => Date.parse(a) - Date.parse(b)));
    }
  });

  it('keeps the rides within the prescription and the usual ranges', () => {
    for (const r of plan) {
      const version = versionOn(prescriptions[r.clientKey], dayOf(r));
      expect(Math.abs(r.spec.cadenceRpm - version.targetCadenceRpm)).toBeLessThanOrEqual(version.cadenceToleranceRpm);
      expect(r.spec.warmupMin).toBe(version.warmupMinutes);
      expect(r.spec.meanPowerW).toBeGreaterThan(1);
      expect(r.spec.meanPowerW).toBeLessThan(45);
      for (const [channel, current] of Object.entries(r.spec.currents)) {
        const limit = version.channels[channel as keyof typeof version.channels]!;
        expect(current!).toBeLessThanOrEqual(limit.maxCurrentMa);
        expect(r.spec.pulseWidthUs).toBe(limit.pulseWidthUs);
        expect(r.spec.frequencyHz).toBe(limit.frequencyHz);
      }
    }
  });

  it('makes every session count except elsie’s latest two', () => {
    for (const c of DEMO_CLIENTS) {
      const rides = ridesOf(c.key);
      rides.forEach((r, i) => {
        const counts = minutesOf(r) >= 0.8 * versionOn(prescriptions[c.key], dayOf(r)).minutesPerSession;
        expect(counts, `${c.key} ${r.spec.startedAt}`).toBe(!(c.key === 'elsie' && i >= rides.length - 2));
      });
    }
  });

  it('grows sessions from under 30 to 45 minutes or more, and power severalfold', () => {
    const rides = ridesOf('jonah');
    expect(minutesOf(rides[0])).toBeLessThan(30);
    expect(minutesOf(rides.at(-1)!)).toBeGreaterThanOrEqual(45);
    expect(rides.at(-1)!.spec.meanPowerW).toBeGreaterThan(4 * rides[0].spec.meanPowerW);
  });

  it('meets every finished week’s target from the first, prorated week on, for all but mairi, elsie and noor', () => {
    for (const c of DEMO_CLIENTS.filter((x) => !['mairi', 'elsie', 'noor'].includes(x.key))) {
      const start = prescriptions[c.key][0].effectiveFrom;
      const pause = pauses.find((p) => p.clientKey === c.key);
      const perWeek = new Map<string, number>();
      for (const r of ridesOf(c.key)) perWeek.set(isoWeekKey(dayOf(r)), (perWeek.get(isoWeekKey(dayOf(r))) ?? 0) + 1);
      for (let day = start; isoWeekKey(day) < weekOf(c.key, 0); day = plusDays(day, 7)) {
        const week = isoWeekKey(day);
        // The program days of the week (from the start on), and 3 a week prorated, rounded up.
        const days = Array.from({ length: 7 }, (_, i) => plusDays(day, i - isoWeekday(day) + 1)).filter((d) => d >= start);
        if (pause && days.some((d) => d >= pause.from && d <= pause.to)) continue;
        expect(perWeek.get(week) ?? 0, `${c.key} ${week}`).toBeGreaterThanOrEqual(Math.ceil((3 * days.length) / 7));
      }
    }
  });

  it('steady: jonah and annika ride three times in every ISO week after the first', () => {
    for (const key of ['jonah', 'annika']) {
      const perWeek = new Map<string, number>();
      for (const r of ridesOf(key)) perWeek.set(isoWeekKey(dayOf(r)), (perWeek.get(isoWeekKey(dayOf(r))) ?? 0) + 1);
      const weeks = [...perWeek.keys()].sort().slice(1, -1);
      expect(weeks.length).toBeGreaterThan(18);
      for (const w of weeks) expect(perWeek.get(w), `${key} ${w}`).toBe(3);
    }
  });

  it('missed week: mairi has no session in the ISO week three before the current one, and three in each since', () => {
    const weeks = ridesOf('mairi').map((r) => isoWeekKey(dayOf(r)));
    expect(weeks.filter((w) => w === weekOf('mairi', 3))).toEqual([]);
    expect(weeks.filter((w) => w === weekOf('mairi', 4)).length).toBe(3);
    expect(weeks.filter((w) => w === weekOf('mairi', 2)).length).toBe(3);
    expect(weeks.filter((w) => w === weekOf('mairi', 1)).length).toBe(3);
  });

  it('power drop: dev ≥ 35 % and hollis 20–35 % below the median of their six sessions before the latest two', () => {
    const drop = (key: string) => {
      const power = ridesOf(key).map((r) => r.spec.meanPowerW);
      const usual = median(power.slice(-8, -2));
      return power.slice(-2).map((p) => 1 - p / usual);
    };
    for (const d of drop('dev')) expect(d).toBeGreaterThanOrEqual(0.35);
    for (const d of drop('hollis')) {
      expect(d).toBeGreaterThan(0.2);
      expect(d).toBeLessThan(0.35);
    }
  });

  it('current rise: kofi’s latest two have ≥ 25 % more current per watt at his usual power', () => {
    const rides = ridesOf('kofi');
    const usualPower = median(rides.slice(-8, -2).map((r) => r.spec.meanPowerW));
    const usualRatio = median(rides.slice(-8, -2).map((r) => currentSum(r) / r.spec.meanPowerW));
    for (const r of rides.slice(-2)) {
      expect(Math.abs(r.spec.meanPowerW / usualPower - 1)).toBeLessThan(0.03);
      expect(currentSum(r) / r.spec.meanPowerW / usualRatio).toBeGreaterThan(1.25);
    }
  });

  it('short sessions: elsie’s latest two are well under 80 % of her 45 prescribed minutes', () => {
    const rides = ridesOf('elsie');
    const version = versionOn(prescriptions.elsie, todayOf('elsie'));
    expect(version.minutesPerSession).toBe(45);
    expect(rides.slice(-2).map(minutesOf)).toEqual([25, 22]);
    expect(minutesOf(rides.at(-3)!)).toBeGreaterThanOrEqual(36);
  });

  it('paused fortnight: rafael has no session in two whole ISO weeks six to eight weeks ago', () => {
    const pause = pauses.find((p) => p.clientKey === 'rafael')!;
    expect(isoWeekday(pause.from)).toBe(1);
    expect(pause.to).toBe(plusDays(pause.from, 13));
    expect(isoWeekKey(pause.from)).toBe(weekOf('rafael', 7));
    expect(ridesOf('rafael').filter((r) => dayOf(r) >= pause.from && dayOf(r) <= pause.to)).toEqual([]);
    expect(ridesOf('rafael').filter((r) => isoWeekKey(dayOf(r)) === weekOf('rafael', 8)).length).toBe(3);
    expect(ridesOf('rafael').filter((r) => isoWeekKey(dayOf(r)) === weekOf('rafael', 5)).length).toBe(3);
  });

  it('no session: noor’s latest ride is at least 12 days before today', () => {
    expect(dayOf(ridesOf('noor').at(-1)!) <= plusDays(todayOf('noor'), -12)).toBe(true);
    expect(dayOf(ridesOf('noor').at(-1)!) > plusDays(todayOf('noor'), -15)).toBe(true);
  });

  it('recently started: wren rides only since the pause for the loan cycle ended, a few times', () => {
    const pause = pauses.find((p) => p.clientKey === 'wren')!;
    expect(pause.from).toBe(prescriptions.wren[0].effectiveFrom);
    expect(isoWeekday(pause.to)).toBe(7);
    const rides = ridesOf('wren');
    expect(rides.length).toBeGreaterThanOrEqual(3);
    expect(rides.length).toBeLessThanOrEqual(6);
    for (const r of rides) expect(dayOf(r) > pause.to).toBe(true);
    expect(prescriptions.wren).toHaveLength(1);
  });

  it('gives only rafael and wren a pause', () => {
    expect(pauses.map((p) => p.clientKey).sort()).toEqual(['rafael', 'wren']);
  });

  it('prescribes from the program start, as seed.ts sets it, within the usual ranges', () => {
    for (const c of DEMO_CLIENTS) {
      const versions = prescriptions[c.key];
      expect(versions[0].effectiveFrom, c.key).toBe(daysAgo(now, c.timeZone, c.startedDaysAgo));
      expect(versions.map((v) => v.effectiveFrom)).toEqual([...versions.map((v) => v.effectiveFrom)].sort());
      for (const v of versions) {
        expect(v.effectiveFrom <= todayOf(c.key)).toBe(true);
        expect(v.sessionsPerWeek).toBe(3);
        expect(v.minutesPerSession).toBeGreaterThanOrEqual(30);
        expect(v.minutesPerSession).toBeLessThanOrEqual(45);
        expect(v.warmupMinutes).toBe(5);
        expect(v.targetCadenceRpm).toBeGreaterThanOrEqual(40);
        expect(v.targetCadenceRpm).toBeLessThanOrEqual(45);
        expect(v.cadenceToleranceRpm).toBe(5);
        expect(v.resistance).toBeGreaterThanOrEqual(1);
        expect(v.resistance).toBeLessThanOrEqual(3);
        expect(Object.keys(v.channels).length).toBeGreaterThanOrEqual(4);
        for (const limit of Object.values(v.channels)) {
          expect(limit!.maxCurrentMa).toBeGreaterThanOrEqual(60);
          expect(limit!.maxCurrentMa).toBeLessThanOrEqual(120);
          expect(limit).toMatchObject({ pulseWidthUs: 300, frequencyHz: 35 });
        }
        expect(v.notes.length).toBeGreaterThan(0);
      }
    }
  });

  it('gives the same plan for the same now', () => {
    expect(demoRidePlan(now)).toEqual(plan);
  });
});

describe('the demo devices', () => {
  it('gives each client one layout, and uses all three', () => {
    const plan = demoRidePlan(new Date(NOWS[0]));
    const layouts = new Map<string, Set<string>>();
    for (const r of plan) layouts.set(r.clientKey, (layouts.get(r.clientKey) ?? new Set()).add(r.layout));
    for (const set of layouts.values()) expect(set.size).toBe(1);
    expect(new Set(plan.map((r) => r.layout))).toEqual(new Set(['A', 'B', 'C']));
    const serials = plan.filter((r) => r.layout !== 'C').map((r) => `${r.clientKey}:${r.spec.deviceSerial}`);
    expect(new Set(serials).size).toBe(new Set(plan.filter((r) => r.layout !== 'C').map((r) => r.clientKey)).size);
  });
});
