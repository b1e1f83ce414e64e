// Time values of a ride file: plain numbers (s or ms), clock strings (mm:ss,
// h:mm:ss) and ISO 8601 date-times (extended format). The clock and ISO
// readers scan character codes so that a long column of timestamps costs no
// regular expression per cell.

import { DateTime, IANAZone } from 'luxon';

export type TimeFormat = 'seconds' | 'milliseconds' | 'clock' | 'iso';

/** Raw time values are kept in the format's own unit; t = (raw − first) ÷ divisor. */
export function timeDivisor(format: TimeFormat): number {
  return format === 'milliseconds' || format === 'iso' ? 1000 : 1;
}

const isDigit = (c: number) => c >= 48 && c <= 57;
const isSpace = (c: number) => c === 32 || c === 9 || c === 10 || c === 13 || c === 0xa0 || c === 0xfeff;

/** A cell that Number() reads as 0 because it is empty or whitespace only. */
export function isBlank(cell: string): boolean {
  for (let i = 0; i < cell.length; i++) if (!isSpace(cell.charCodeAt(i))) return false;
  return true;
}

/** Number() of a cell, NaN for blank or non-finite cells. */
export function readNumber(cell: string | undefined): number {
  if (cell === undefined) return NaN;
  const v = +cell;
  if (v - v !== 0) return NaN;
  if (v === 0 && isBlank(cell)) return NaN;
  return v;
}

// Parser state shared by the scanners below (single-threaded, reset per call).
let pos = 0;
let end = 0;

function trimBounds(s: string): void {
  pos = 0;
  end = s.length;
  while (pos < end && isSpace(s.charCodeAt(pos))) pos++;
  while (end > pos && isSpace(s.charCodeAt(end - 1))) end--;
}

/** Reads exactly `n` digits at pos, or −1. */
function fixedDigits(s: string, n: number): number {
  if (pos + n > end) return -1;
  let v = 0;
  for (let i = 0; i < n; i++) {
    const c = s.charCodeAt(pos + i);
    if (!isDigit(c)) return -1;
    v = v * 10 + (c - 48);
  }
  pos += n;
  return v;
}

// Fractions keep at most 15 digits so that the integer numerator stays exact.
const MAX_FRACTION_DIGITS = 15;

/** Reads ".ddd" or ",ddd" at pos as a fraction of one; 0 when there is none, −1 when malformed. */
function fraction(s: string): number {
  if (pos >= end) return 0;
  const sep = s.charCodeAt(pos);
  if (sep !== 46 && sep !== 44) return 0;
  pos++;
  let num = 0;
  let den = 1;
  let count = 0;
  while (pos < end && isDigit(s.charCodeAt(pos))) {
    if (count < MAX_FRACTION_DIGITS) {
      num = num * 10 + (s.charCodeAt(pos) - 48);
      den *= 10;
    }
    count++;
    pos++;
  }
  return count === 0 ? -1 : num / den;
}

/** "mm:ss" or "h:mm:ss" (optionally with a fraction of a second) as seconds; NaN otherwise. */
export function parseClock(s: string): number {
  trimBounds(s);
  let first = 0;
  let count = 0;
  while (pos < end && isDigit(s.charCodeAt(pos))) {
    first = first * 10 + (s.charCodeAt(pos) - 48);
    pos++;
    count++;
  }
  if (count === 0 || count > 9 || pos >= end || s.charCodeAt(pos) !== 58) return NaN;
  pos++;
  const second = fixedDigits(s, 2);
  if (second < 0 || second > 59) return NaN;
  let total: number;
  if (pos < end && s.charCodeAt(pos) === 58) {
    pos++;
    const third = fixedDigits(s, 2);
    if (third < 0 || third > 59) return NaN;
    total = first * 3600 + second * 60 + third;
  } else {
    total = first * 60 + second;
  }
  const frac = fraction(s);
  if (frac < 0 || pos !== end) return NaN;
  return total + frac;
}

function daysInMonth(y: number, m: number): number {
  if (m === 2) return (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0 ? 29 : 28;
  return m === 4 || m === 6 || m === 9 || m === 11 ? 30 : 31;
}

// Set by parseIsoMs: whether the last accepted value carried Z or a UTC offset.
let lastHadOffset = false;

/**
 * An ISO 8601 date-time "YYYY-MM-DD[T ]hh:mm[:ss[.fff]][Z|±hh[:mm]]" as epoch
 * milliseconds; NaN otherwise. Without Z or an offset the wall time is read as UTC.
 */
export function parseIsoMs(s: string): number {
  trimBounds(s);
  const y = fixedDigits(s, 4);
  if (y < 1000 || s.charCodeAt(pos) !== 45) return NaN;
  pos++;
  const mo = fixedDigits(s, 2);
  if (mo < 1 || mo > 12 || s.charCodeAt(pos) !== 45) return NaN;
  pos++;
  const d = fixedDigits(s, 2);
  if (d < 1 || d > daysInMonth(y, mo)) return NaN;
  const sep = s.charCodeAt(pos);
  if (sep !== 84 && sep !== 116 && sep !== 32) return NaN;
  pos++;
  const h = fixedDigits(s, 2);
  if (h < 0 || h > 23 || s.charCodeAt(pos) !== 58) return NaN;
  pos++;
  const mi = fixedDigits(s, 2);
  if (mi < 0 || mi > 59) return NaN;
  let sec = 0;
  let frac = 0;
  if (pos < end && s.charCodeAt(pos) === 58) {
    pos++;
    sec = fixedDigits(s, 2);
    if (sec < 0 || sec > 59) return NaN;
    frac = fraction(s);
    if (frac < 0) return NaN;
  }
  let offsetMin = 0;
  lastHadOffset = false;
  if (pos < end) {
    const c = s.charCodeAt(pos);
    if (c === 90 || c === 122) {
      pos++;
      lastHadOffset = true;
    } else if (c === 43 || c === 45) {
      pos++;
      const oh = fixedDigits(s, 2);
      if (oh < 0 || oh > 23) return NaN;
      let om = 0;
      if (pos < end) {
        if (s.charCodeAt(pos) === 58) pos++;
        om = fixedDigits(s, 2);
        if (om < 0 || om > 59) return NaN;
      }
      offsetMin = (c === 45 ? -1 : 1) * (oh * 60 + om);
      lastHadOffset = true;
    }
  }
  if (pos !== end) return NaN;
  return Date.UTC(y, mo - 1, d, h, mi, sec) + frac * 1000 - offsetMin * 60000;
}

export function isoHasOffset(s: string): boolean {
  return Number.isFinite(parseIsoMs(s)) && lastHadOffset;
}

/** Epoch ms of a wall time (given as if it were UTC) in an IANA time zone; null for an unknown zone. */
export function wallTimeToEpochMs(wallMs: number, timeZone: string): number | null {
  // Only IANA names: luxon would also take "local" or "system", the zone of whatever machine runs this.
  if (!IANAZone.isValidZone(timeZone)) return null;
  const whole = Math.floor(wallMs);
  const d = new Date(whole);
  const dt = DateTime.fromObject(
    {
      year: d.getUTCFullYear(),
      month: d.getUTCMonth() + 1,
      day: d.getUTCDate(),
      hour: d.getUTCHours(),
      minute: d.getUTCMinutes(),
      second: d.getUTCSeconds(),
      millisecond: d.getUTCMilliseconds(),
    },
    { zone: IANAZone.create(timeZone) },
  );
  return dt.isValid ? dt.toMillis() + (wallMs - whole) : null;
}

/** ISO 8601 instant in UTC with milliseconds and Z, e.g. "2026-10-05T07:30:00.000Z". */
export function toIsoUtc(epochMs: number): string {
  return new Date(Math.floor(epochMs)).toISOString();
}

/** The format of a time column, told from its first readable cell. */
export function detectTimeFormat(cell: string, millisecondsUnit: boolean): TimeFormat | null {
  if (Number.isFinite(readNumber(cell))) return millisecondsUnit ? 'milliseconds' : 'seconds';
  if (Number.isFinite(parseClock(cell))) return 'clock';
  if (Number.isFinite(parseIsoMs(cell))) return 'iso';
  return null;
}
