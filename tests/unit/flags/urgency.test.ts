import { describe, expect, it } from 'vitest';
import { demoPauses, demoPrescriptions, demoRidePlan, type DemoRide } from '../../../src/lib/demo/ride-story';
import { DEMO_CLIENTS } from '../../../src/lib/demo/scenario';
import type { FlagSession } from '../../../src/lib/flags';
import { compareClientsByUrgency, compareUrgency, type Urgent } from '../../../src/lib/flags/urgency';
import { flagsOf } from '../demo/story-checks';

// Triage by clinical urgency: a blood pressure rise (a reading or warning
// signs that may be autonomic dysreflexia) above everything, then the other
// urgent flags, then review, then information; the longest waiting first
// within a group. The order below is worked out by hand from that rule.

const sessionOf = (r: DemoRide, i: number): FlagSession => ({
  id: `${r.clientKey}-${i}`,
  startedAt: new Date(Date.parse(r.spec.startedAt)).toISOString(),
  durationS: (r.spec.warmupMin + r.spec.activeMin + r.spec.cooldownMin) * 60,
  meanPowerW: r.spec.meanPowerW,
  currentPerWattMaPerW: Object.values(r.spec.currents).reduce((a, b) => a + b!, 0) / r.spec.meanPowerW,
});

describe('triage order with the demo’s flags', () => {
  it('puts a blood pressure rise raised today above the older urgent no-session flag', { timeout: 60_000 }, () => {
    const now = new Date('2026-11-18T12:00:00Z');
    const plan = demoRidePlan(now);
    const pauses = demoPauses(now);
    const prescriptions = demoPrescriptions(now);
    const rows = DEMO_CLIENTS.map((c) => {
      const flags: Urgent[] = flagsOf(c.timeZone, now, prescriptions[c.key], pauses.filter((p) => p.clientKey === c.key), plan.filter((r) => r.clientKey === c.key).map(sessionOf)).map((f) => ({
        kind: f.kind,
        severity: f.severity,
        // The demo's flags were raised before today's check; Noor's the longest ago.
        raisedAt: c.key === 'noor' ? '2026-11-10T08:00:00Z' : '2026-11-16T08:00:00Z',
      }));
      // As the carer-check story records it: 172 mmHg after Jonah's ride this morning, urgent.
      if (c.key === 'jonah') flags.push({ kind: 'bp_rise', severity: 'urgent', raisedAt: '2026-11-18T10:40:00Z' });
      return { name: c.name, flags: flags.sort(compareUrgency) };
    }).filter((r) => r.flags.length);

    const ordered = rows.sort(compareClientsByUrgency).map((r) => `${r.name}: ${r.flags[0].kind} ${r.flags[0].severity}`);
    expect(ordered.slice(0, 3)).toEqual([
      'Jonah Pryce: bp_rise urgent',
      'Noor Haddad: missed_sessions urgent', // urgent, the longest waiting
      'Dev Ramaswamy: power_drop urgent',
    ]);
    expect(new Set(ordered.slice(3, 6))).toEqual(new Set(['Mairi Caldwell: missed_sessions review', 'Hollis Ferreira: power_drop review', 'Kofi Mensah-Lowe: current_rise review']));
    expect(ordered.slice(6)).toEqual(['Elsie Varga: short_session info']);
  });

  it('keeps a blood pressure rise for review above an urgent flag of another kind, and ages within a group', () => {
    const flags: (Urgent & { id: string })[] = [
      { id: 'info-old', kind: 'short_session', severity: 'info', raisedAt: '2026-01-01T00:00:00Z' },
      { id: 'urgent-new', kind: 'missed_sessions', severity: 'urgent', raisedAt: '2026-11-18T00:00:00Z' },
      { id: 'bp-review', kind: 'bp_rise', severity: 'review', raisedAt: '2026-11-18T09:00:00Z' },
      { id: 'review', kind: 'skin_concern', severity: 'review', raisedAt: '2026-11-01T00:00:00Z' },
      { id: 'urgent-old', kind: 'power_drop', severity: 'urgent', raisedAt: '2026-11-02T00:00:00Z' },
      { id: 'bp-urgent', kind: 'bp_rise', severity: 'urgent', raisedAt: '2026-11-18T10:00:00Z' },
      { id: 'drop-review', kind: 'bp_drop', severity: 'review', raisedAt: '2026-10-01T00:00:00Z' },
    ];
    expect(flags.sort(compareUrgency).map((f) => f.id)).toEqual(['bp-review', 'bp-urgent', 'urgent-old', 'urgent-new', 'drop-review', 'review', 'info-old']);
  });
});
