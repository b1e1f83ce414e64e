import { describe, expect, it } from 'vitest';
import { clinicOverviewFigures, type OverviewClientInput } from '../../../src/lib/overview/figures';

const NOW = new Date('2026-11-11T12:00:00Z'); // Wednesday of 2026-W46
const rx = [{ effectiveFrom: '2026-09-01', sessionsPerWeek: 3, minutesPerSession: 30 }];
const client = (id: string, extra: Partial<OverviewClientInput>): OverviewClientInput => ({
  id,
  name: id,
  timeZone: 'Europe/London',
  programStart: '2026-09-01',
  prescriptions: rx,
  pauses: [],
  sessions: [],
  adherence4wPct: null,
  openFlagKinds: [],
  ...extra,
});
const ride = (startedAt: string, meanPowerW: number | null, activeS = 600) => ({ startedAt, activeS, meanPowerW });

describe('clinic overview figures', () => {
  const clients = [
    client('steady', { adherence4wPct: 100, sessions: [ride('2026-09-02T10:00:00Z', 10), ride('2026-09-03T10:00:00Z', 10), ride('2026-11-09T10:00:00Z', 15), ride('2026-11-10T10:00:00Z', 15)], openFlagKinds: [] }),
    client('falling', { adherence4wPct: 67, sessions: [ride('2026-09-02T10:00:00Z', 20), ride('2026-10-20T10:00:00Z', 10)], openFlagKinds: ['power_drop', 'current_rise'] }),
    client('paused', { adherence4wPct: null, pauses: [{ from: '2026-11-01', to: '2026-11-20' }], sessions: [ride('2026-10-01T10:00:00Z', 5)] }),
    client('waiting', { prescriptions: [{ effectiveFrom: '2026-12-01', sessionsPerWeek: 3, minutesPerSession: 30 }], programStart: '2026-12-01' }),
  ];
  const f = clinicOverviewFigures(clients, NOW, 'Europe/London');

  it('counts active clients (a prescription in effect today) and those paused today', () => {
    expect(f.groups.find((g) => g.key === 'active')!.clientIds).toEqual(['steady', 'falling', 'paused']);
    expect(f.groups.find((g) => g.key === 'paused')!.clientIds).toEqual(['paused']);
  });

  it('bands 4-week adherence and lists clients by open flag kind', () => {
    expect(Object.fromEntries(f.adherence.map((a) => [a.key, a.clientIds]))).toEqual({
      'adherence:100': ['steady'],
      'adherence:80-99': [],
      'adherence:50-79': ['falling'],
      'adherence:0-49': [],
      'adherence:none': ['paused'],
    });
    expect(f.flags.find((k) => k.kind === 'power_drop')!.clientIds).toEqual(['falling']);
    expect(f.flags.find((k) => k.kind === 'bp_rise')!.clientIds).toEqual([]);
  });

  it('counts sessions per ISO week over 26 weeks, with the clients who rode', () => {
    expect(f.weeks).toHaveLength(26);
    expect(f.weeks.at(-1)!.isoWeek).toBe('2026-W46');
    expect(f.weeks.at(-1)).toMatchObject({ sessions: 2, clientIds: ['steady'] });
    expect(f.weeks.find((w) => w.isoWeek === '2026-W36')).toMatchObject({ sessions: 3, clientIds: ['steady', 'falling'] });
  });

  it('takes the median power change of first against last sessions since the start', () => {
    // steady: 2 sessions each end, 10 → 15 W (+50 %); falling: 1 each, 20 → 10 W (−50 %); paused: one session, no figure.
    expect(f.power.clients.map((p) => [p.clientId, p.changeW, p.changePct])).toEqual([
      ['steady', 5, 50],
      ['falling', -10, -50],
    ]);
    expect(f.power.medianChangeW).toBe(-2.5);
    expect(f.power.medianChangePct).toBe(0);
  });

  it('lists active clients quiet for more than 14 days, the paused one included and marked', () => {
    // falling: last ride 20 Oct, 22 days before 11 Nov; paused: 1 Oct, 41 days; steady rode yesterday.
    expect(f.quiet.map((q) => [q.clientId, q.daysSinceLastSession, q.paused])).toEqual([
      ['falling', 22, false],
      ['paused', 41, true],
    ]);
  });
});
