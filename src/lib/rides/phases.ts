// The phase of each sample: from a phase column when the file has one, else
// from the channel current (first to last sample with any current > 0 is
// active, before it passive, after it cooldown), else every sample is active.

import type { Phase } from './types';
import { RowTally } from './warnings';

const PHASE_WORDS = new Map<string, Phase>([
  ['passive', 'passive'],
  ['warmup', 'passive'],
  ['active', 'active'],
  ['stim', 'active'],
  ['stimulation', 'active'],
  ['fes', 'active'],
  ['cooldown', 'cooldown'],
  ['recovery', 'cooldown'],
]);

/** The phase a cell names ("Warm-up" → passive), undefined for a blank cell, null for an unknown word. */
export function phaseOfWord(cell: string | undefined): Phase | null | undefined {
  const key = (cell ?? '').toLowerCase().replace(/[^\p{L}]+/gu, '');
  if (key === '') return undefined;
  return PHASE_WORDS.get(key) ?? null;
}

// The warning quotes a few of the unknown words, not all of them.
export const MAX_WORDS_SHOWN = 3;

export interface ColumnPhases {
  phases: Phase[];
  /** Samples whose word was unknown, as data-row indices. */
  unknown: RowTally;
  /** The first few unknown words, as written. */
  unknownWords: string[];
}

/**
 * Phases from the column's cells in sample order (`rowOf` gives each sample's data row). Blank and unknown cells take
 * the phase of the nearest known sample before them (at the start: after them).
 * Null when no cell names a known phase.
 */
export function phasesFromColumn(cells: (string | undefined)[], rowOf: Int32Array): ColumnPhases | null {
  const cache = new Map<string, Phase | null | undefined>();
  const read = (c: string | undefined) => {
    const key = c ?? '';
    let p = cache.get(key);
    if (p === undefined && !cache.has(key)) {
      p = phaseOfWord(key);
      cache.set(key, p);
    }
    return p;
  };
  const n = cells.length;
  const filled = new Array<Phase | null>(n);
  const unknown = new RowTally();
  const unknownWords: string[] = [];
  let firstKnown: Phase | null = null;
  let current: Phase | null = null;
  for (let k = 0; k < n; k++) {
    const p = read(cells[k]);
    if (p === null) {
      unknown.add(rowOf[k]);
      const word = (cells[k] ?? '').trim();
      if (unknownWords.length < MAX_WORDS_SHOWN && !unknownWords.includes(word)) unknownWords.push(word);
    }
    if (p) {
      current = p;
      firstKnown ??= p;
    }
    filled[k] = current;
  }
  if (firstKnown === null) return null;
  const lead = firstKnown;
  return { phases: filled.map((p) => p ?? lead), unknown, unknownWords };
}

/** Phases from channel currents; null when no sample has a current above 0. */
export function phasesFromCurrent(channels: Float64Array[], n: number): Phase[] | null {
  let first = n;
  let last = -1;
  for (const values of channels) {
    for (let k = 0; k < first; k++) {
      if (values[k] > 0) {
        first = k;
        break;
      }
    }
    for (let k = n - 1; k > last; k--) {
      if (values[k] > 0) {
        last = k;
        break;
      }
    }
  }
  if (last < 0) return null;
  const phases = new Array<Phase>(n);
  for (let k = 0; k < n; k++) phases[k] = k < first ? 'passive' : k <= last ? 'active' : 'cooldown';
  return phases;
}
