import { NAMED_CHANNELS, NUMBERED_CHANNELS } from '../../lib/rides/types';

const ORDER: string[] = [...NAMED_CHANNELS, ...NUMBERED_CHANNELS];

/** Channels in one fixed order (PRODUCT.md's list, left before right), so every session lists them alike. */
export function orderedChannels(names: string[]): string[] {
  const rank = (n: string) => (ORDER.includes(n) ? ORDER.indexOf(n) : ORDER.length);
  return [...names].sort((a, b) => rank(a) - rank(b) || a.localeCompare(b));
}
