// The whole demo plan, written as ride files and read back by Kinloop's
// parser: every file parses, its summary matches its spec, and the parsed
// sessions leave the flags the story promises. About 570 files, a few
// seconds each way on a laptop-class machine; no timing is asserted.
import { describe, expect, it } from 'vitest';
import { generateRide } from '../../../src/lib/demo/ride-generator';
import { RIDE_LAYOUTS } from '../../../src/lib/demo/ride-layouts';
import { demoPauses, demoPrescriptions, demoRidePlan } from '../../../src/lib/demo/ride-story';
import { DEMO_CLIENTS } from '../../../src/lib/demo/scenario';
import type { FlagSession } from '../../../src/lib/flags';
import { parseRide } from '../../../src/lib/rides/parse';
import { expectedFlags, flagsOf, labels } from './story-checks';

describe('the demo plan as ride files', () => {
  it('parses every file into its spec and leaves the story flags from the parsed sessions', { timeout: 120_000 }, () => {
    const now = new Date('2026-11-19T20:00:00Z'); // a Thursday: elsie's last finished week was met
    const plan = demoRidePlan(now);
    const sessions = new Map<string, FlagSession[]>();
    for (const [i, r] of plan.entries()) {
      const parsed = parseRide(RIDE_LAYOUTS[r.layout].write(generateRide(r.spec, r.seed)));
      if (!parsed.ok) throw new Error(`${r.fileName}: ${parsed.error.code} ${parsed.error.message}`);
      const s = parsed.summary;
      expect(s.warnings, r.fileName).toEqual([]);
      expect(Date.parse(s.startedAt!), r.fileName).toBe(Date.parse(r.spec.startedAt));
      expect(s.durationS, r.fileName).toBe((r.spec.warmupMin + r.spec.activeMin + r.spec.cooldownMin) * 60);
      expect(s.activeS, r.fileName).toBe(r.spec.activeMin * 60);
      expect(Math.abs(s.meanPowerW! / r.spec.meanPowerW - 1), r.fileName).toBeLessThan(0.02);
      const list = sessions.get(r.clientKey) ?? [];
      list.push({ id: `${r.clientKey}-${i}`, startedAt: s.startedAt!, durationS: s.durationS, meanPowerW: s.meanPowerW, currentPerWattMaPerW: s.currentPerWattMaPerW });
      sessions.set(r.clientKey, list);
    }
    const prescriptions = demoPrescriptions(now);
    const pauses = demoPauses(now);
    for (const c of DEMO_CLIENTS) {
      const flags = flagsOf(c.timeZone, now, prescriptions[c.key], pauses.filter((p) => p.clientKey === c.key), sessions.get(c.key) ?? []);
      expect(labels(flags), c.key).toEqual(expectedFlags(c.key, now.toISOString().replace('.000Z', 'Z')));
    }
  });
});
