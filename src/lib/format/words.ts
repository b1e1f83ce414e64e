// One word per thing (PRODUCT.md's vocabulary): the names of channels and
// phases wherever they are shown. The passive phase is the warm-up.
import { siteLabel } from '../checks/labels';

/** "quadriceps_left" → "Left quadriceps", "channel_3" → "Channel 3". */
export function channelLabel(name: string): string {
  const words = siteLabel(name);
  return words.charAt(0).toUpperCase() + words.slice(1);
}

export const PHASE_LABELS: Record<string, string> = { passive: 'Warm-up', active: 'Active', cooldown: 'Cool-down' };

export function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
