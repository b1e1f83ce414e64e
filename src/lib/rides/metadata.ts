// Metadata from the lines before the header row: `key: value` lines (or a
// two-cell "key;value" row), the device's serial and name, and the start time.

import { splitLine, type Delimiter } from './csv';
import { headerKey } from './headers';
import type { PreambleLine } from './layout';
import { parseIsoMs } from './time';

export interface PreambleEntry {
  key: string;
  value: string;
  line: number;
}

const MAX_KEY_LENGTH = 60;
const validKey = (key: string) => key !== '' && key.length <= MAX_KEY_LENGTH && /\p{L}/u.test(key);

function entryOf(p: PreambleLine, delimiter: Delimiter): PreambleEntry | null {
  const cells = splitLine(p.text, delimiter).map((c) => c.trim());
  while (cells.length > 0 && cells[cells.length - 1] === '') cells.pop();
  if (cells.length === 0) return null;
  const colon = cells[0].indexOf(':');
  if (colon >= 0) {
    const key = cells[0].slice(0, colon).trim();
    const rest = cells[0].slice(colon + 1).trim();
    const value = (rest === '' ? cells.slice(1) : [rest, ...cells.slice(1)]).join(delimiter).trim();
    return validKey(key) && value !== '' ? { key, value, line: p.line } : null;
  }
  if (cells.length === 2 && validKey(cells[0])) return { key: cells[0], value: cells[1], line: p.line };
  return null;
}

/** The metadata entries of the preamble, first occurrence of a key kept. */
export function readPreamble(lines: PreambleLine[], delimiter: Delimiter): PreambleEntry[] {
  const seen = new Set<string>();
  const out: PreambleEntry[] = [];
  for (const p of lines) {
    const e = entryOf(p, delimiter);
    if (e === null || seen.has(headerKey(e.key))) continue;
    seen.add(headerKey(e.key));
    out.push(e);
  }
  return out;
}

function lookup(entries: PreambleEntry[], keys: string[]): PreambleEntry | null {
  for (const k of keys) {
    const e = entries.find((x) => headerKey(x.key) === k);
    if (e) return e;
  }
  return null;
}

const SERIAL_KEYS = ['serialnumber', 'serial', 'serialno', 'sn', 'deviceserial', 'deviceserialnumber'];
const NAME_KEYS = ['devicename', 'device', 'model', 'devicemodel'];

export function deviceOf(entries: PreambleEntry[]): { deviceSerial: string | null; deviceName: string | null } {
  return { deviceSerial: lookup(entries, SERIAL_KEYS)?.value ?? null, deviceName: lookup(entries, NAME_KEYS)?.value ?? null };
}

const START_KEYS = ['starttime', 'startedat', 'started', 'start', 'startdatetime', 'sessionstart', 'ridestart', 'recordedat', 'recorded', 'datetime', 'date'];
const DATE_KEYS = ['date', 'startdate', 'ridedate', 'sessiondate'];
const TIME_OF_DAY_KEYS = ['time', 'starttime', 'start', 'startedat'];
const DATE_ONLY = /^\d{4}-\d{2}-\d{2}$/;
const TIME_ONLY = /^(\d{1,2}):(\d{2}(?::\d{2}(?:[.,]\d+)?)?)$/;

export type PreambleStart =
  | { kind: 'none' }
  | { kind: 'unreadable'; entry: PreambleEntry }
  | { kind: 'found'; entry: PreambleEntry; text: string; ms: number };

/**
 * The start time from the preamble: an ISO 8601 date-time under a start-time
 * key, or a date-only entry combined with a time-of-day entry.
 */
export function startOf(entries: PreambleEntry[]): PreambleStart {
  let unreadable: PreambleEntry | null = null;
  for (const k of START_KEYS) {
    const e = entries.find((x) => headerKey(x.key) === k);
    if (!e) continue;
    const ms = parseIsoMs(e.value);
    if (Number.isFinite(ms)) return { kind: 'found', entry: e, text: e.value, ms };
    if (!DATE_ONLY.test(e.value) && !TIME_ONLY.test(e.value)) unreadable ??= e;
  }
  const date = DATE_KEYS.map((k) => entries.find((x) => headerKey(x.key) === k && DATE_ONLY.test(x.value))).find(Boolean);
  const time = TIME_OF_DAY_KEYS.map((k) => entries.find((x) => headerKey(x.key) === k && TIME_ONLY.test(x.value))).find(Boolean);
  if (date && time) {
    const m = TIME_ONLY.exec(time.value);
    const text = `${date.value}T${m![1].padStart(2, '0')}:${m![2]}`;
    const ms = parseIsoMs(text);
    if (Number.isFinite(ms)) return { kind: 'found', entry: date, text, ms };
  }
  return unreadable ? { kind: 'unreadable', entry: unreadable } : { kind: 'none' };
}
