// parseRide: ride-file bytes → canonical series and summary, or a refusal.
// One decode, one papaparse call over the data rows, one pass per column.

import type { TimeColumn } from './columns';
import { lineBreakOf } from './csv';
import { decodeBytes, looksLikeText } from './decode';
import { median } from '../analytics/median';
import { PAUSE_S } from './deltas';
import { describeField, quantityOf, type ColumnReading } from './headers';
import { commasToPoints, findLayout, usesDecimalComma, type PreambleLine } from './layout';
import { checkDataRows, longLine } from './limits';
import { deviceOf, readPreamble, startOf } from './metadata';
import { DEFAULT_METRES_PER_REV, summarise } from './metrics';
import { orderRows, pick, type RowOrder } from './order';
import { phasesFromColumn, phasesFromCurrent } from './phases';
import { dropImplausible } from './plausibility';
import { refusals } from './refusals';
import { readRows, type RowData } from './rows';
import { isoHasOffset, timeDivisor, toIsoUtc, wallTimeToEpochMs, type TimeFormat } from './time';
import type { CanonicalField, ChannelName, ParsedRide, ParseOptions, Phase, RideRefusal, RideSeries } from './types';
import type { Quantity, Unit } from './units';
import { counted, linesOf } from './warnings';

export const DEFAULT_MAX_BYTES = 25 * 1024 * 1024;

const PROFILE_TIME_FORMATS = new Map<string, TimeFormat>([
  ['seconds', 'seconds'],
  ['milliseconds', 'milliseconds'],
  ['clock', 'clock'],
  ['iso', 'iso'],
]);

const SERIES_KEYS: Partial<Record<CanonicalField, 'cadenceRpm' | 'powerW' | 'distanceM' | 'heartRateBpm' | 'pulseWidthUs' | 'frequencyHz'>> = {
  cadence: 'cadenceRpm',
  power: 'powerW',
  distance: 'distanceM',
  heart_rate: 'heartRateBpm',
  pulse_width: 'pulseWidthUs',
  frequency: 'frequencyHz',
};

const positive = (v: number | undefined) => (typeof v === 'number' && Number.isFinite(v) && v > 0 ? v : undefined);

interface Measured {
  field: CanonicalField;
  quantity: Quantity;
  values: Float64Array;
}

type LineOf = (row: number) => number;

interface Timeline {
  order: RowOrder;
  format: TimeFormat;
  /** Raw time of the first sample, in the format's unit (epoch ms for ISO). */
  raw0: number;
  t: Float64Array;
  /** Raw time per data row (NaN where unreadable), for the numeric columns to skip those rows. */
  raw: Float64Array;
}

/** Time column → samples in time order with t in seconds from the first; null when no row has a time. */
function readTimeline(time: TimeColumn, reading: ColumnReading, profileFormat: TimeFormat | null, lineOf: LineOf, warnings: string[]): Timeline | null {
  if (time.unreadable.count > 0) {
    warnings.push(`${counted(time.unreadable.count, 'row without a readable time', 'rows without a readable time')} skipped ${linesOf(time.unreadable, lineOf)}`);
  }
  if (time.rollover >= 0) {
    warnings.push(`The time of day passes midnight on line ${lineOf(time.rollover)}; the times from there on were counted on the next day.`);
  }
  const order = orderRows(time.raw);
  const { keep } = order;
  const n = keep.length;
  if (n === 0) return null;

  let format = time.format as TimeFormat;
  if (format === 'seconds' && !reading.unitGiven && profileFormat === null && n > 1) {
    const steps = new Float64Array(n - 1);
    for (let k = 0; k < n - 1; k++) steps[k] = time.raw[keep[k + 1]] - time.raw[keep[k]];
    const step = median(steps);
    if (step !== null && step > PAUSE_S) {
      format = 'milliseconds';
      warnings.push(
        `The time column "${reading.header}" states no unit and its median step of ${step} would make every step a pause if read as seconds; it was read as milliseconds.`,
      );
    }
  }
  if (order.firstOutOfOrder >= 0) {
    warnings.push(`The rows were not in time order (the first out of order is on line ${lineOf(order.firstOutOfOrder)}); they were sorted by time.`);
  }
  if (order.duplicates.count > 0) {
    warnings.push(
      `${counted(order.duplicates.count, 'row with the same time as the row before it', 'rows with the same time as the row before them')} dropped ${linesOf(order.duplicates, lineOf)}`,
    );
  }

  const raw0 = time.raw[keep[0]];
  const divisor = timeDivisor(format);
  const t = new Float64Array(n);
  for (let k = 0; k < n; k++) t[k] = divisor === 1 ? time.raw[keep[k]] - raw0 : (time.raw[keep[k]] - raw0) / divisor;
  return { order, format, raw0, t, raw: time.raw };
}

/** Numeric columns in sample order, implausible values dropped; warnings for non-numbers, then for drops. */
function readMeasurements(data: RowData, readings: ColumnReading[], measuredIndexes: number[], timeline: Timeline, lineOf: LineOf, warnings: string[]): Measured[] {
  const measured: Measured[] = [];
  const drops: string[] = [];
  measuredIndexes.forEach((index, i) => {
    const r = readings[index];
    const field = r.field as CanonicalField;
    const quantity = quantityOf(field) as Quantity;
    const column = data.numeric[i];
    const label = describeField(field);
    if (column.nonNumeric.count > 0) {
      warnings.push(
        `${counted(column.nonNumeric.count, `${label} value that is not a number`, `${label} values that are not numbers`)} ignored ${linesOf(column.nonNumeric, lineOf)}`,
      );
    }
    const values = pick(column.values, timeline.order);
    drops.push(...dropImplausible(values, quantity, label, timeline.order.keep, lineOf));
    measured.push({ field, quantity, values });
  });
  warnings.push(...drops);
  return measured;
}

function metresPerRevOf(options: ParseOptions, warnings: string[]): number {
  const asked = options.metresPerRev ?? options.profile?.metresPerRev;
  if (asked === undefined || positive(asked) !== undefined) return asked ?? DEFAULT_METRES_PER_REV;
  warnings.push(`Metres per revolution "${asked}" is not a positive number; ${DEFAULT_METRES_PER_REV} m was used.`);
  return DEFAULT_METRES_PER_REV;
}

export function parseRide(bytes: Uint8Array, options: ParseOptions = {}): ParsedRide | RideRefusal {
  const maxBytes = positive(options.maxBytes) ?? DEFAULT_MAX_BYTES;
  if (bytes.length > maxBytes) return refusals.tooLarge(bytes.length, maxBytes);
  if (bytes.length === 0) return refusals.empty();
  const { text, encoding } = decodeBytes(bytes);
  if (!/\S/.test(text)) return refusals.empty();
  if (!looksLikeText(text)) return refusals.notText();

  const lineBreak = lineBreakOf(text);
  const long = longLine(text, lineBreak);
  if (long !== null) return refusals.fromLimit(long);

  const found = findLayout(text, options.profile);
  if (!found.ok) return refusals.fromLayout(found.problem);
  const layout = found.layout;
  const { headerLine, readings, delimiter } = layout;
  const warnings: string[] = [];
  for (const r of readings) {
    if (r.problem !== null) warnings.push(`Column "${r.header}" (line ${headerLine}) was ignored: ${r.problem}.`);
  }

  let data = text.slice(layout.dataOffset);
  const checked = checkDataRows(data, delimiter, layout.lineBreak, headerLine + 1);
  if (checked.problem !== null) return refusals.fromLimit(checked.problem);
  const decimalComma = usesDecimalComma(data, delimiter);
  if (decimalComma) data = commasToPoints(data);

  const timeIndex = readings.findIndex((r) => r.field === 'time');
  const profileFormat = PROFILE_TIME_FORMATS.get(String(options.profile?.timeFormat)) ?? null;
  const measuredIndexes = readings.flatMap((r, i) => (r.field === null || r.field === 'time' || r.field === 'phase' ? [] : [i]));
  const rows = readRows(data, delimiter, layout.lineBreak, headerLine + 1, checked.lines + 1, {
    timeIndex,
    timeFormat: profileFormat,
    millisecondsUnit: readings[timeIndex].unit?.divide === 1000,
    numeric: measuredIndexes.map((i) => ({ index: i, unit: readings[i].unit as Unit })),
    phaseIndex: readings.findIndex((r) => r.field === 'phase'),
  });
  const { lineOf } = rows;

  const timeline = readTimeline(rows.time, readings[timeIndex], profileFormat, lineOf, warnings);
  if (timeline === null) return refusals.noDataRows(headerLine, rows.anyRow);
  const { keep } = timeline.order;
  const n = keep.length;

  const measured = readMeasurements(rows, readings, measuredIndexes, timeline, lineOf, warnings);
  if (!measured.some((m) => m.values.some((v) => v === v))) return refusals.noValues(headerLine);

  const channels: Partial<Record<ChannelName, Float64Array>> = {};
  for (const m of measured) if (m.quantity === 'current') channels[m.field as ChannelName] = m.values;
  const series: RideSeries = { t: timeline.t, phase: phasesOf(rows.phaseCells, readings, keep, channels, lineOf, warnings), channels };
  for (const m of measured) {
    const key = SERIES_KEYS[m.field];
    if (key) series[key] = m.values;
  }

  const entries = readPreamble(layout.preamble, delimiter);
  const startedAt = startedAtOf(entries, timeline.format, timeline.raw0, rows.time.firstCell, options.timeZone, warnings);
  if (n === 1) warnings.push("The file has only one sample, so the ride's durations are 0 s.");
  const metresPerRev = metresPerRevOf(options, warnings);

  return {
    ok: true,
    summary: summarise(series, { metresPerRev, startedAt, warnings }),
    series,
    metadata: {
      encoding,
      delimiter,
      decimalComma,
      headerLine,
      columns: readings.map((r) => ({
        header: r.header,
        field: r.field,
        unit: r.field === 'time' ? (timeline.format === 'milliseconds' ? 'ms' : 's') : (r.unit?.symbol ?? null),
        problem: r.problem,
      })),
      preamble: Object.fromEntries(entries.map((e) => [e.key, e.value])),
      ...deviceOf(entries),
    },
  };
}

function phasesOf(
  phaseCells: (string | undefined)[] | null,
  readings: ColumnReading[],
  keep: Int32Array,
  channels: Partial<Record<ChannelName, Float64Array>>,
  lineOf: LineOf,
  warnings: string[],
): Phase[] {
  const n = keep.length;
  const phaseIndex = readings.findIndex((r) => r.field === 'phase');
  if (phaseCells !== null) {
    const cells = new Array<string | undefined>(n);
    for (let k = 0; k < n; k++) cells[k] = phaseCells[keep[k]];
    const fromColumn = phasesFromColumn(cells, keep);
    if (fromColumn !== null) {
      const u = fromColumn.unknown;
      if (u.count > 0) {
        const words = fromColumn.unknownWords.map((w) => `"${w}"`).join(', ');
        warnings.push(
          `${u.count === 1 ? '1 row has' : `${u.count} rows have`} a phase Kinloop does not know (${words}); ${u.count === 1 ? 'it was' : 'they were'} given the phase of the nearest row with a known phase ${linesOf(u, lineOf)}.`,
        );
      }
      return fromColumn.phases;
    }
    warnings.push(`The phase column "${readings[phaseIndex].header}" holds no phase word Kinloop knows; the phases were worked out as if the file had none.`);
  }
  const currents = Object.values(channels);
  if (currents.length === 0) return new Array<Phase>(n).fill('active');
  const fromCurrent = phasesFromCurrent(currents, n);
  if (fromCurrent !== null) return fromCurrent;
  warnings.push('No channel current is above 0 mA, so the whole ride was counted as passive.');
  return new Array<Phase>(n).fill('passive');
}

/** An instant from a value that may lack a UTC offset: the time zone if given, else UTC with a warning. */
function instantOf(ms: number, hasOffset: boolean, what: string, timeZone: string | undefined, warnings: string[]): number {
  if (hasOffset) return ms;
  if (timeZone !== undefined) {
    const zoned = wallTimeToEpochMs(ms, timeZone);
    if (zoned !== null) return zoned;
    warnings.push(`The time zone "${timeZone}" is not known; ${what} was read as UTC.`);
    return ms;
  }
  warnings.push(`${what[0].toUpperCase()}${what.slice(1)} has no UTC offset and no time zone was given; it was read as UTC.`);
  return ms;
}

function startedAtOf(
  entries: ReturnType<typeof readPreamble>,
  format: TimeFormat,
  raw0: number,
  firstTimeCell: string,
  timeZone: string | undefined,
  warnings: string[],
): string | null {
  const start = startOf(entries);
  if (start.kind === 'found') {
    const what = `the start time "${start.text}" (line ${start.entry.line})`;
    return toIsoUtc(instantOf(start.ms, isoHasOffset(start.text), what, timeZone, warnings));
  }
  if (start.kind === 'unreadable') {
    warnings.push(`The start time "${start.entry.value}" (line ${start.entry.line}) is not an ISO 8601 date-time and was not used.`);
  }
  if (format !== 'iso') return null;
  return toIsoUtc(instantOf(raw0, isoHasOffset(firstTimeCell), 'the first timestamp', timeZone, warnings));
}

/**
 * The device serial from the lines at the top of a file, even one the parser
 * refuses: an import profile attached to that serial may be what reads it.
 */
export function deviceSerialOf(bytes: Uint8Array): string | null {
  const { text } = decodeBytes(bytes.subarray(0, 64 * 1024));
  const lines: PreambleLine[] = text
    .split(/\r?\n|\r/)
    .slice(0, 50)
    .map((t, i) => ({ line: i + 1, text: t }))
    .filter((l) => l.text.trim() !== '');
  for (const delimiter of [';', ',', '\t'] as const) {
    const serial = deviceOf(readPreamble(lines, delimiter)).deviceSerial;
    if (serial) return serial;
  }
  return null;
}
