import { describe, expect, it } from 'vitest';
import { reportFigures, type ReportSessionInput } from '../../../src/lib/reports/figures';

const TZ = 'Europe/London';
// Weeks of 2026 in London: W41 starts Mon 5 Oct, W45 starts Mon 2 Nov (GMT from 25 Oct).
const session = (startedAt: string, meanPowerW: number, activeS: number, workKj: number | null = null): ReportSessionInput => ({
  id: startedAt,
  startedAt,
  durationS: activeS + 60,
  activeS,
  meanPowerW,
  peakPower5sW: meanPowerW + 5,
  workKj,
  distanceM: 1000,
  currentPerWattMaPerW: null,
  enduranceRatioPct: null,
  counted: true,
  baselineW: null,
});
const week = (isoWeek: string, counted: number, extra: Partial<{ prescribed: number; paused: boolean }> = {}) => ({ isoWeek, prescribed: 2, counted, short: 0, met: counted >= 2, paused: false, ...extra });

function figures(sessions: ReportSessionInput[], weeks: ReturnType<typeof week>[], energy = { efficiencyPct: 7, bodyMassKg: 70, volitionalControl: true as boolean | null }) {
  return reportFigures({ timeZone: TZ, from: '2026-10-05', to: '2026-11-08', today: '2026-11-10', sessions, weeks, prescriptions: [], pauses: [], flags: [], checks: [], notes: [], energy });
}

describe('report figures', () => {
  const sessions = [
    session('2026-10-04T10:00:00Z', 99, 600), // Sunday before the period: left out
    session('2026-10-05T09:00:00Z', 10, 600, 6),
    session('2026-10-08T09:00:00Z', 20, 1200, 24),
    session('2026-10-13T09:00:00Z', 12, 600, 7.2),
    session('2026-11-02T09:00:00Z', 30, 900, 27),
    session('2026-11-08T23:30:00Z', 40, 600, 24), // Sunday 23:30 GMT: still the period's last day
  ];
  const weeks = [week('2026-W41', 2), week('2026-W42', 1), week('2026-W43', 0, { prescribed: 0, paused: true }), week('2026-W44', 0), week('2026-W45', 2)];

  it('sums each ISO week of the client’s calendar: active minutes and power weighted by active time', () => {
    const f = figures(sessions, weeks);
    expect(f.sessions.count).toBe(5);
    // W41 by hand: (10 × 600 + 20 × 1200) / 1800 = 16.67 W over 30 active minutes.
    expect(f.weeks[0].activeMin).toBe(30);
    expect(f.weeks[0].meanPowerW).toBeCloseTo(16.667, 3);
    // W45: (30 × 900 + 40 × 600) / 1500 = 34 W over 25 minutes.
    expect(f.weeks[4].activeMin).toBe(25);
    expect(f.weeks[4].meanPowerW).toBe(34);
    expect(f.weeks[3].meanPowerW).toBeNull();
    expect(f.weeks.map((w) => w.finished)).toEqual([true, true, true, true, true]);
  });

  it('compares power held to the end over the first and last sessions that have it', () => {
    // Sessions with a ratio: 80, 84, (none), 90, 94 in the period. Four of them, so two at each end:
    // first (80 + 84) / 2 = 82 %, last (90 + 94) / 2 = 92 %.
    const ratios = [null, 80, 84, null, 90, 94];
    const f = figures(sessions.map((x, i) => ({ ...x, enduranceRatioPct: ratios[i] })), weeks);
    expect(f.sessions.enduranceHalf).toBe(2);
    expect(f.sessions.firstEndurance).toBe(82);
    expect(f.sessions.lastEndurance).toBe(92);
    expect(f.series.endurance.map((p) => p.y)).toEqual([80, 84, 90, 94]);
  });

  it('compares the first and last finished weeks that asked for sessions, never overlapping', () => {
    const f = figures(sessions, weeks);
    // Four comparable weeks (W43 wholly paused is left out): two at each end, W41–W42 against W44–W45.
    expect(f.blocks!.weeks).toBe(2);
    // First: (30 + 10) / 2 = 20 min a week; power (6000 + 24000 + 7200) / 2400 = 15.5 W.
    expect(f.blocks!.first).toEqual({ activeMinPerWeek: 20, meanPowerW: 15.5 });
    // Last: (0 + 25) / 2 = 12.5 min; 34 W. Change −7.5 min, +18.5 W, +119.4 %.
    expect(f.blocks!.last).toEqual({ activeMinPerWeek: 12.5, meanPowerW: 34 });
    expect(f.blocks!.powerChangeW).toBe(18.5);
    expect(f.blocks!.powerChangePct).toBeCloseTo(119.35, 2);
  });

  it('estimates energy from the work at the clinic’s efficiency, and the ACSM figure only for volitional riders with a body mass', () => {
    const f = figures(sessions, weeks);
    // Work 6 + 24 + 7.2 + 27 + 24 = 88.2 kJ; 88,200 J / (0.07 × 4184) = 301.15 kcal.
    expect(f.energy.totalKcal).toBeCloseTo(301.15, 2);
    expect(f.energy.perSessionKcal).toBeCloseTo(60.23, 2);
    // Period power (6000 + 24000 + 7200 + 27000 + 24000) J / 3900 s = 22.615 W.
    expect(f.energy.acsm!.atPowerW).toBeCloseTo(22.615, 3);
    // source: ACSM leg-cycling equation: 7 + 1.8 × 22.615 × 6.118 / 70 = 10.558 mL/kg/min.
    expect(f.energy.acsm!.vo2MlKgMin).toBeCloseTo(10.558, 3);
    expect(figures(sessions, weeks, { efficiencyPct: 7, bodyMassKg: 70, volitionalControl: false }).energy.acsm).toBeNull();
    expect(figures(sessions, weeks, { efficiencyPct: 7, bodyMassKg: null as unknown as number, volitionalControl: true }).energy.acsm).toBeNull();
    // Half the efficiency, twice the estimate.
    expect(figures(sessions, weeks, { efficiencyPct: 3.5, bodyMassKg: 70, volitionalControl: null }).energy.totalKcal).toBeCloseTo(602.29, 2);
  });
});
