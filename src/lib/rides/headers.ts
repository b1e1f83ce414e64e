// Header words → Kinloop field and unit, exactly the table in PRODUCT.md
// ("Canonical ride metrics"), plus the import-profile mapping for anything else.

import type { CanonicalField, ChannelName, ImportProfile } from './types';
import { NAMED_CHANNELS, NUMBERED_CHANNELS } from './types';
import { defaultUnit, findUnit, isUnitWord, unitKey, type Quantity, type Unit } from './units';

export interface ColumnReading {
  header: string;
  field: CanonicalField | null;
  unit: Unit | null;
  /** Whether the header (or the import profile) states the unit; otherwise the field's default applies. */
  unitGiven: boolean;
  /** Set when the header names a field but the column cannot be used (unknown unit, second column for a field). */
  problem: string | null;
}

export const MEASUREMENT_QUANTITIES: ReadonlySet<Quantity> = new Set<Quantity>([
  'cadence',
  'power',
  'distance',
  'current',
  'pulse_width',
  'frequency',
  'heart_rate',
]);

const CHANNELS: ReadonlySet<string> = new Set<string>([...NAMED_CHANNELS, ...NUMBERED_CHANNELS]);
const FIELDS: ReadonlySet<string> = new Set<string>(['time', 'phase', 'cadence', 'power', 'distance', 'pulse_width', 'frequency', 'heart_rate', ...CHANNELS]);

export function quantityOf(field: CanonicalField): Quantity | null {
  if (field === 'phase') return null;
  if (CHANNELS.has(field)) return 'current';
  return field as Quantity;
}

export function isMeasurement(field: CanonicalField | null): boolean {
  if (field === null) return false;
  const q = quantityOf(field);
  return q !== null && MEASUREMENT_QUANTITIES.has(q);
}

const words = (...list: string[]) => new Set(list);
const FIELD_WORDS: [Exclude<CanonicalField, ChannelName>, Set<string>][] = [
  ['time', words('time', 'elapsed', 'elapsedtime', 't', 'seconds', 'sec', 'timestamp')],
  ['phase', words('phase', 'mode', 'stage', 'segment')],
  ['cadence', words('cadence', 'rpm', 'crankrpm', 'pedalrate')],
  ['power', words('power', 'watts', 'poweroutput', 'output')],
  ['distance', words('distance', 'dist')],
  ['pulse_width', words('pulsewidth', 'pw')],
  ['frequency', words('frequency', 'freq', 'stimfrequency')],
  ['heart_rate', words('heartrate', 'hr')],
];

const MUSCLES = new Map<string, string>([
  ...['quad', 'quads', 'quadriceps'].map((w): [string, string] => [w, 'quadriceps']),
  ...['ham', 'hams', 'hamstring', 'hamstrings'].map((w): [string, string] => [w, 'hamstrings']),
  ...['glute', 'glutes', 'gluteal', 'gluteals', 'gluteus'].map((w): [string, string] => [w, 'gluteals']),
]);
const SIDES = new Map<string, string>([
  ...['l', 'left', 'lt'].map((w): [string, string] => [w, 'left']),
  ...['r', 'right', 'rt'].map((w): [string, string] => [w, 'right']),
]);
const CHANNEL_EXTRAS = words('current', 'stim', 'amplitude');
const CHANNEL_PREFIXES = words('ch', 'channel');
// A time header may carry the value format instead of a unit, e.g. "Time (mm:ss)".
const TIME_FORMAT_WORDS = words('mmss', 'hmmss', 'hhmmss', 'hms', 'clock', 'iso', 'utc', 'local');

function channelOf(ws: string[]): ChannelName | null {
  if (ws.length >= 2 && CHANNEL_PREFIXES.has(ws[0]) && /^\d+$/.test(ws[1])) {
    const n = Number(ws[1]);
    const rest = ws.slice(2);
    if (n >= 1 && n <= 8 && rest.every((w) => CHANNEL_EXTRAS.has(w))) return `channel_${n}` as ChannelName;
    return null;
  }
  let muscle: string | null = null;
  let side: string | null = null;
  for (const w of ws) {
    if (MUSCLES.has(w)) {
      if (muscle !== null) return null;
      muscle = MUSCLES.get(w)!;
    } else if (SIDES.has(w)) {
      if (side !== null) return null;
      side = SIDES.get(w)!;
    } else if (!CHANNEL_EXTRAS.has(w)) {
      return null;
    }
  }
  return muscle !== null && side !== null ? (`${muscle}_${side}` as ChannelName) : null;
}

function fieldOfWords(ws: string[]): CanonicalField | null {
  if (ws.length === 0) return null;
  const compact = ws.join('');
  for (const [field, set] of FIELD_WORDS) if (set.has(compact)) return field;
  return channelOf(ws);
}

/** Splits "HamsRight", "quadL" and "ch1" at case and digit boundaries, then lower-cases. */
function wordsOf(tokens: string[]): string[] {
  return tokens.flatMap((tok) =>
    tok
      .replace(/(\p{Ll})(\p{Lu})/gu, '$1 $2')
      .replace(/(\p{L})(\p{N})/gu, '$1 $2')
      .replace(/(\p{N})(\p{L})/gu, '$1 $2')
      .toLowerCase()
      .split(' ')
      .filter(Boolean),
  );
}

const tokensOf = (s: string) => s.split(/[^\p{L}\p{N}]+/u).filter(Boolean);

/** Header text compared case-insensitively with punctuation and spaces ignored (for import-profile keys). */
export function headerKey(text: string): string {
  return text.normalize('NFKC').toLowerCase().replace(/[^\p{L}\p{N}]+/gu, '');
}

interface Named {
  field: CanonicalField | null;
  unitText: string | null;
}

function splitBracketUnit(text: string): { name: string; unitText: string | null } {
  const m = /^(.*?)\s*[([]([^()[\]]*)[)\]]\s*$/u.exec(text);
  if (m && m[1].trim() !== '') return { name: m[1], unitText: m[2].trim() };
  return { name: text, unitText: null };
}

function nameHeader(text: string): Named {
  const { name, unitText } = splitBracketUnit(text);
  const tokens = tokensOf(name);
  if (unitText !== null) return { field: fieldOfWords(wordsOf(tokens)) ?? bpmField(unitText), unitText };
  const all = wordsOf(tokens);
  const whole = fieldOfWords(all);
  if (whole !== null) return { field: whole, unitText: null };
  // A unit after a separator keeps its case ("Power_kW"); otherwise the last split word ("PowerKW").
  const candidates: [string[], string][] = [];
  if (tokens.length >= 2) candidates.push([wordsOf(tokens.slice(0, -1)), tokens[tokens.length - 1]]);
  if (all.length >= 2) candidates.push([all.slice(0, -1), all[all.length - 1]]);
  for (const [ws, last] of candidates) {
    if (!isUnitWord(last)) continue;
    const field = fieldOfWords(ws) ?? bpmField(last);
    if (field !== null) return { field, unitText: last };
  }
  return { field: null, unitText: null };
}

// "Any header with unit bpm" is a heart rate, whatever its name.
const bpmField = (unitText: string): CanonicalField | null => (unitKey(unitText) === 'bpm' ? 'heart_rate' : null);

function withUnit(header: string, field: CanonicalField, unitText: string | null): ColumnReading {
  const q = quantityOf(field);
  if (q === null) return { header, field, unit: null, unitGiven: false, problem: null };
  if (unitText === null || unitText === '') return { header, field, unit: defaultUnit(q), unitGiven: false, problem: null };
  const u = findUnit(q, unitText);
  if (u !== null) return { header, field, unit: u, unitGiven: true, problem: null };
  if (q === 'time' && TIME_FORMAT_WORDS.has(headerKey(unitText))) return { header, field, unit: defaultUnit(q), unitGiven: true, problem: null };
  return { header, field: null, unit: null, unitGiven: false, problem: `its unit "${unitText}" is not one Kinloop reads for ${describeField(field)}` };
}

// Profiles are stored settings edited by people: entries that are not well-formed are skipped.
type ProfileColumn = { key: string; spec: { field: string; unit?: unknown } };
const profileIndexes = new WeakMap<ImportProfile, Map<string, { order: number; entry: ProfileColumn }>>();

/**
 * The profile's columns by header key, built once per profile: matching a
 * header is then two lookups, not a pass over every profile column.
 */
function profileIndex(profile: ImportProfile): Map<string, { order: number; entry: ProfileColumn }> {
  let index = profileIndexes.get(profile);
  if (index) return index;
  index = new Map();
  let order = 0;
  for (const [key, spec] of Object.entries(profile.columns)) {
    const k = headerKey(key);
    if (k === '' || typeof spec?.field !== 'string' || index.has(k)) continue;
    index.set(k, { order: order++, entry: { key: k, spec } });
  }
  profileIndexes.set(profile, index);
  return index;
}

function fromProfile(header: string, profile: ImportProfile | undefined): ColumnReading | null {
  if (!profile?.columns || typeof profile.columns !== 'object') return null;
  const index = profileIndex(profile);
  const full = headerKey(header);
  const { name, unitText } = splitBracketUnit(header);
  const bare = headerKey(name);
  // The profile's first entry that matches either form of the header wins.
  const a = index.get(full);
  const b = index.get(bare);
  const hit = a && b ? (a.order <= b.order ? a : b) : (a ?? b);
  if (!hit) return null;
  const { key: k, spec } = hit.entry;
  if (!FIELDS.has(spec.field)) {
    return { header, field: null, unit: null, unitGiven: false, problem: `the import profile maps it to "${spec.field}", which is not a Kinloop field` };
  }
  const unit = typeof spec.unit === 'string' ? spec.unit : null;
  return withUnit(header, spec.field as CanonicalField, unit ?? (k === full ? null : unitText));
}

// Longer cells are text, not column names; the limit also keeps the pattern matching below cheap.
const MAX_HEADER_LENGTH = 200;

/** How one header cell is read: the import profile first, then the built-in table. */
export function readHeaderCell(raw: string, profile?: ImportProfile): ColumnReading {
  const header = raw.trim();
  if (header.length > MAX_HEADER_LENGTH) return { header, field: null, unit: null, unitGiven: false, problem: null };
  const mapped = fromProfile(header, profile);
  if (mapped !== null) return mapped;
  const { field, unitText } = nameHeader(header.normalize('NFKC'));
  if (field === null) return { header, field: null, unit: null, unitGiven: false, problem: null };
  return withUnit(header, field, unitText);
}

/** Reads a header row; a second column for a field already taken is left out. */
export function readHeaderRow(cells: string[], profile?: ImportProfile): ColumnReading[] {
  const taken = new Map<CanonicalField, string>();
  return cells.map((cell) => {
    const r = readHeaderCell(cell, profile);
    if (r.field === null) return r;
    const first = taken.get(r.field);
    if (first !== undefined) {
      return { ...r, field: null, unit: null, unitGiven: false, problem: `it also reads as ${describeField(r.field)}; only the first such column ("${first}") is used` };
    }
    taken.set(r.field, r.header);
    return r;
  });
}

export function describeField(field: CanonicalField): string {
  if (quantityOf(field) === 'current') return `${field} current`;
  return field.replace('_', ' ');
}
