// Plain sentences about a prescription version, and what one version changed
// from the one before it, for the page header and the version history.
import type { ChannelLimits } from '../../lib/db/tables';
import { orderedChannels } from '../rides/channel-order';
import { channelLabel } from '../../lib/format/words';
import type { PrescriptionVersionView } from './types';

type Field = 'sessionsPerWeek' | 'minutesPerSession' | 'warmupMinutes' | 'targetCadenceRpm' | 'cadenceToleranceRpm' | 'resistance';
const FIELDS: { key: Field; label: string; unit: string }[] = [
  { key: 'sessionsPerWeek', label: 'Sessions per week', unit: '' },
  { key: 'minutesPerSession', label: 'Minutes per session', unit: 'min' },
  { key: 'warmupMinutes', label: 'Warm-up', unit: 'min' },
  { key: 'targetCadenceRpm', label: 'Target cadence', unit: 'rpm' },
  { key: 'cadenceToleranceRpm', label: 'Cadence tolerance', unit: 'rpm' },
  { key: 'resistance', label: 'Resistance level', unit: '' },
];
const CHANNEL_FIELDS: { key: keyof ChannelLimits; label: string; unit: string }[] = [
  { key: 'maxCurrentMa', label: 'max current', unit: 'mA' },
  { key: 'pulseWidthUs', label: 'pulse width', unit: 'µs' },
  { key: 'frequencyHz', label: 'frequency', unit: 'Hz' },
];

const withUnit = (value: number | null | undefined, unit: string) => (value === null || value === undefined ? 'not set' : unit ? `${value} ${unit}` : String(value));

/** "3 sessions a week, 30 min each (5 min warm-up)". */
export function doseSummary(p: PrescriptionVersionView): string {
  const warmup = p.warmupMinutes ? ` (${p.warmupMinutes} min warm-up)` : '';
  return `${p.sessionsPerWeek} sessions a week, ${p.minutesPerSession} min each${warmup}`;
}

/** "cadence 45 ± 5 rpm, resistance 2", or null when neither is set. */
export function riding(p: PrescriptionVersionView): string | null {
  const parts = [
    p.targetCadenceRpm !== null ? `cadence ${p.targetCadenceRpm}${p.cadenceToleranceRpm !== null ? ` ± ${p.cadenceToleranceRpm}` : ''} rpm` : null,
    p.resistance !== null ? `resistance ${p.resistance}` : null,
  ].filter((x): x is string => x !== null);
  return parts.length ? parts.join(', ') : null;
}

/** "up to 90 mA, 300 µs, 35 Hz" (the set limits only). */
export function channelLimitsText(limits: ChannelLimits): string {
  const parts = [
    limits.maxCurrentMa !== undefined ? `up to ${limits.maxCurrentMa} mA` : null,
    limits.pulseWidthUs !== undefined ? `${limits.pulseWidthUs} µs` : null,
    limits.frequencyHz !== undefined ? `${limits.frequencyHz} Hz` : null,
  ].filter(Boolean);
  return parts.length ? parts.join(', ') : 'no limits set';
}

/** What `next` changed from `previous`; the first version has nothing to compare with. */
export function versionChanges(previous: PrescriptionVersionView | undefined, next: PrescriptionVersionView): string[] {
  if (!previous) return ['First version of the prescription.'];
  const changes: string[] = [];
  for (const f of FIELDS) {
    if (previous[f.key] !== next[f.key]) changes.push(`${f.label}: ${withUnit(previous[f.key], f.unit)} → ${withUnit(next[f.key], f.unit)}`);
  }
  const names = orderedChannels([...new Set([...Object.keys(previous.channels), ...Object.keys(next.channels)])]);
  for (const name of names) {
    const before = previous.channels[name];
    const after = next.channels[name];
    if (!before) changes.push(`${channelLabel(name)} added: ${channelLimitsText(after)}`);
    else if (!after) changes.push(`${channelLabel(name)} removed`);
    else {
      for (const f of CHANNEL_FIELDS) {
        if (before[f.key] !== after[f.key]) changes.push(`${channelLabel(name)} ${f.label}: ${withUnit(before[f.key], f.unit)} → ${withUnit(after[f.key], f.unit)}`);
      }
    }
  }
  if ((previous.notes ?? '') !== (next.notes ?? '')) changes.push('Notes changed');
  return changes.length ? changes : ['Same values as the version before; only the effective date differs.'];
}
