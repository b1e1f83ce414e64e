// Plain words for flag codes and the events in a flag's history.
import type { FlagSeverity, FlagState } from '../../lib/flags/types';

/** Badge colours: text and tint pairs of global.css that keep 4.5:1. */
export const SEVERITY_TONES: Record<FlagSeverity, string> = {
  urgent: 'bg-brick-tint text-brick border-brick',
  review: 'bg-ochre-tint text-ochre border-ochre',
  info: 'bg-slate-tint text-slate border-slate',
};

export const STATE_LABELS: Record<FlagState, string> = {
  open: 'Open',
  acknowledged: 'Acknowledged',
  resolved: 'Resolved',
  withdrawn: 'Withdrawn',
};

const EVENT_LABELS: Record<string, string> = {
  raised: 'Raised',
  updated: 'Updated with newer sessions',
  reopened: 'Reopened',
  cleared: 'Condition cleared',
  withdrawn: 'Withdrawn: the condition did not hold after all',
  acknowledged: 'Acknowledged',
  resolved: 'Resolved',
  snoozed: 'Snoozed',
};

export function eventLabel(action: string): string {
  return EVENT_LABELS[action] ?? action.charAt(0).toUpperCase() + action.slice(1);
}

export const isLive = (state: FlagState) => state === 'open' || state === 'acknowledged';
