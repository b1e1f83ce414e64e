import { describe, it, expect } from 'vitest';
import { channelLimitsText, doseSummary, riding, versionChanges } from '../../../src/components/client/prescription-wording';
import type { PrescriptionVersionView } from '../../../src/components/client/types';

function version(v: Partial<PrescriptionVersionView> = {}): PrescriptionVersionView {
  return {
    id: 'v1',
    version: 1,
    effectiveFrom: '2026-10-05',
    sessionsPerWeek: 3,
    minutesPerSession: 30,
    warmupMinutes: 5,
    targetCadenceRpm: 45,
    cadenceToleranceRpm: 5,
    resistance: 2,
    channels: { quadriceps_left: { maxCurrentMa: 80, pulseWidthUs: 300, frequencyHz: 35 } },
    notes: null,
    createdBy: { userId: 'u1', name: 'Therapist' },
    createdAt: '2026-10-01T09:00:00Z',
    ...v,
  };
}

describe('doseSummary', () => {
  it('gives sessions, minutes and the warm-up', () => {
    expect(doseSummary(version())).toBe('3 sessions a week, 30 min each (5 min warm-up)');
  });

  it('leaves out a warm-up that is not set or zero', () => {
    expect(doseSummary(version({ warmupMinutes: null }))).toBe('3 sessions a week, 30 min each');
    expect(doseSummary(version({ warmupMinutes: 0 }))).toBe('3 sessions a week, 30 min each');
  });
});

describe('riding', () => {
  it('gives cadence with its tolerance, and resistance', () => {
    expect(riding(version())).toBe('cadence 45 ± 5 rpm, resistance 2');
  });

  it('leaves out what is not set', () => {
    expect(riding(version({ cadenceToleranceRpm: null }))).toBe('cadence 45 rpm, resistance 2');
    expect(riding(version({ targetCadenceRpm: null, cadenceToleranceRpm: null }))).toBe('resistance 2');
    expect(riding(version({ resistance: null }))).toBe('cadence 45 ± 5 rpm');
  });

  it('shows a resistance of zero, which is set', () => {
    expect(riding(version({ targetCadenceRpm: null, resistance: 0 }))).toBe('resistance 0');
  });

  it('is null when neither cadence nor resistance is set', () => {
    expect(riding(version({ targetCadenceRpm: null, cadenceToleranceRpm: null, resistance: null }))).toBeNull();
  });
});

describe('channelLimitsText', () => {
  it('lists the set limits in the order current, pulse width, frequency', () => {
    expect(channelLimitsText({ frequencyHz: 35, maxCurrentMa: 90, pulseWidthUs: 300 })).toBe('up to 90 mA, 300 µs, 35 Hz');
    expect(channelLimitsText({ pulseWidthUs: 250 })).toBe('250 µs');
  });

  it('says when no limit is set', () => {
    expect(channelLimitsText({})).toBe('no limits set');
  });
});

describe('versionChanges', () => {
  it('has nothing to compare the first version with', () => {
    expect(versionChanges(undefined, version())).toEqual(['First version of the prescription.']);
  });

  it('says when only the effective date differs', () => {
    expect(versionChanges(version(), version({ id: 'v2', version: 2, effectiveFrom: '2026-11-02', createdAt: '2026-10-30T09:00:00Z' }))).toEqual([
      'Same values as the version before; only the effective date differs.',
    ]);
  });

  it('gives each changed setting with its unit, in the order of the form', () => {
    const next = version({ resistance: 3, sessionsPerWeek: 4, minutesPerSession: 40, targetCadenceRpm: 50 });
    expect(versionChanges(version(), next)).toEqual([
      'Sessions per week: 3 → 4',
      'Minutes per session: 30 min → 40 min',
      'Target cadence: 45 rpm → 50 rpm',
      'Resistance level: 2 → 3',
    ]);
  });

  it('words a setting that was set or cleared as "not set"', () => {
    expect(versionChanges(version(), version({ warmupMinutes: null, cadenceToleranceRpm: null }))).toEqual([
      'Warm-up: 5 min → not set',
      'Cadence tolerance: 5 rpm → not set',
    ]);
    expect(versionChanges(version({ resistance: null }), version())).toEqual(['Resistance level: not set → 2']);
  });

  it('names channels added, removed and changed, in channel order', () => {
    const previous = version({
      channels: { channel_2: { maxCurrentMa: 60 }, quadriceps_left: { maxCurrentMa: 80, pulseWidthUs: 300, frequencyHz: 35 } },
    });
    const next = version({
      channels: {
        quadriceps_left: { maxCurrentMa: 90, pulseWidthUs: 300 },
        hamstrings_left: {},
        quadriceps_right: { maxCurrentMa: 80, pulseWidthUs: 300, frequencyHz: 35 },
      },
    });
    expect(versionChanges(previous, next)).toEqual([
      'Left quadriceps max current: 80 mA → 90 mA',
      'Left quadriceps frequency: 35 Hz → not set',
      'Right quadriceps added: up to 80 mA, 300 µs, 35 Hz',
      'Left hamstrings added: no limits set',
      'Channel 2 removed',
    ]);
  });

  it('notes changed notes without quoting them, and treats no notes and empty notes alike', () => {
    expect(versionChanges(version({ notes: 'Keep an eye on the left knee.' }), version({ notes: 'Both knees fine.' }))).toEqual(['Notes changed']);
    expect(versionChanges(version({ notes: null }), version({ notes: '' }))).toEqual(['Same values as the version before; only the effective date differs.']);
  });

  it('lists settings first, then channels, then notes', () => {
    const next = version({ sessionsPerWeek: 4, channels: {}, notes: 'New' });
    expect(versionChanges(version(), next)).toEqual(['Sessions per week: 3 → 4', 'Left quadriceps removed', 'Notes changed']);
  });
});
