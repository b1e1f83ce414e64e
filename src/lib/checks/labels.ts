// Plain words for the stored codes of a check, for reasons and screens.
import type { AdSymptom, OtherEvent, SkinState } from './check-input';

export const AD_SYMPTOM_LABELS: Record<AdSymptom, string> = {
  pounding_headache: 'pounding headache',
  flushing_or_sweating_above_injury: 'flushing or sweating above the injury level',
  goose_bumps: 'goose bumps',
  blurred_vision: 'blurred vision',
  nasal_congestion: 'stuffy nose',
  slow_pulse: 'slow pulse',
};

export const OTHER_EVENT_LABELS: Record<OtherEvent, string> = {
  spasms: 'spasms',
  pain: 'pain',
  light_headedness: 'light-headedness',
  fall_or_transfer_problem: 'a fall or a problem with a transfer',
};

export const SKIN_STATE_LABELS: Record<SkinState, string> = {
  normal: 'normal',
  redness_fades_30min: 'redness that fades within 30 minutes',
  redness_persists: 'redness that lasts beyond 30 minutes',
  broken_skin: 'broken skin',
};

/** "quadriceps_left" → "left quadriceps", "channel_3" → "channel 3". */
export function siteLabel(site: string): string {
  const parts = site.split('_').filter((p) => p !== '');
  const last = parts[parts.length - 1];
  if (parts.length > 1 && (last === 'left' || last === 'right')) {
    return [last, ...parts.slice(0, -1)].join(' ');
  }
  return parts.join(' ');
}

/** "a", "a and b", "a, b and c". */
export function joinList(items: string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}
