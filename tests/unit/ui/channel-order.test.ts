import { describe, it, expect } from 'vitest';
import { orderedChannels } from '../../../src/components/rides/channel-order';
import { NAMED_CHANNELS, NUMBERED_CHANNELS } from '../../../src/lib/rides/types';

describe('orderedChannels', () => {
  it('follows the channel list of the vocabulary, left before right, named before numbered', () => {
    const shuffled = ['channel_2', 'gluteals_right', 'quadriceps_right', 'channel_1', 'hamstrings_left', 'quadriceps_left'];
    expect(orderedChannels(shuffled)).toEqual(['quadriceps_left', 'quadriceps_right', 'hamstrings_left', 'gluteals_right', 'channel_1', 'channel_2']);
  });

  it('restores the full list from any order', () => {
    const all = [...NAMED_CHANNELS, ...NUMBERED_CHANNELS];
    expect(orderedChannels([...all].reverse())).toEqual(all);
  });

  it('puts names outside the list last, alphabetically', () => {
    expect(orderedChannels(['zeta', 'channel_9', 'quadriceps_left', 'alpha'])).toEqual(['quadriceps_left', 'alpha', 'channel_9', 'zeta']);
  });

  it('sorts channel_8 before a channel_10 that the list does not know', () => {
    expect(orderedChannels(['channel_10', 'channel_8'])).toEqual(['channel_8', 'channel_10']);
  });

  it('leaves the given array as it was', () => {
    const names = ['channel_1', 'quadriceps_left'];
    orderedChannels(names);
    expect(names).toEqual(['channel_1', 'quadriceps_left']);
  });

  it('handles an empty list', () => {
    expect(orderedChannels([])).toEqual([]);
  });
});
