// The normalised ride model shared by the parser, the ingest service, the API
// and the analytics. Field names follow ../shared/PRODUCT.md ("Canonical ride
// metrics"); change both together.

export type Phase = 'passive' | 'active' | 'cooldown';

export const NAMED_CHANNELS = [
  'quadriceps_left',
  'quadriceps_right',
  'hamstrings_left',
  'hamstrings_right',
  'gluteals_left',
  'gluteals_right',
] as const;
export const NUMBERED_CHANNELS = [
  'channel_1',
  'channel_2',
  'channel_3',
  'channel_4',
  'channel_5',
  'channel_6',
  'channel_7',
  'channel_8',
] as const;
export type ChannelName = (typeof NAMED_CHANNELS)[number] | (typeof NUMBERED_CHANNELS)[number];

export interface ChannelSummary {
  meanCurrentMa: number | null;
  maxCurrentMa: number | null;
}

export interface RideSummary {
  startedAt: string | null;
  durationS: number;
  activeS: number;
  passiveS: number;
  cooldownS: number;
  distanceM: number | null;
  meanPowerW: number | null;
  peakPower5sW: number | null;
  workKj: number | null;
  meanCadenceRpm: number | null;
  currentPerWattMaPerW: number | null;
  /** Mean power of the last 300 s of active time as a % of the first 300 s; null under 12 active minutes. */
  enduranceRatioPct: number | null;
  channels: Partial<Record<ChannelName, ChannelSummary>>;
  pulseWidthUs: number | null;
  frequencyHz: number | null;
  samples: number;
  warnings: string[];
}

/**
 * One ride's samples in canonical units, column-wise. A value that is missing
 * or was dropped as implausible is NaN. `t` is seconds from the first sample.
 */
export interface RideSeries {
  t: Float64Array;
  phase: Phase[];
  cadenceRpm?: Float64Array;
  powerW?: Float64Array;
  distanceM?: Float64Array;
  heartRateBpm?: Float64Array;
  pulseWidthUs?: Float64Array;
  frequencyHz?: Float64Array;
  channels: Partial<Record<ChannelName, Float64Array>>;
}

export type RefusalCode =
  | 'empty_file'
  | 'not_text'
  | 'no_header'
  | 'no_time_column'
  | 'no_data_rows'
  | 'no_measurements'
  | 'too_large'
  | 'line_too_long'
  | 'too_many_columns'
  | 'too_many_rows';

export interface RideRefusal {
  ok: false;
  error: { code: RefusalCode; message: string; line?: number };
}

export type CanonicalField =
  | 'time'
  | 'phase'
  | 'cadence'
  | 'power'
  | 'distance'
  | 'pulse_width'
  | 'frequency'
  | 'heart_rate'
  | ChannelName;

/** A saved mapping from one device's CSV layout to Kinloop's fields. */
export interface ImportProfile {
  name: string;
  /** Keys are header names as they appear in the file (matched case-insensitively, ignoring punctuation). */
  columns: Record<string, { field: CanonicalField; unit?: string }>;
  metresPerRev?: number;
  timeFormat?: 'seconds' | 'milliseconds' | 'clock' | 'iso';
}

export interface RideMetadata {
  encoding: string;
  delimiter: string;
  decimalComma: boolean;
  headerLine: number;
  /** How each header of the file was read: the field and unit, or null when it was ignored. */
  columns: { header: string; field: CanonicalField | null; unit: string | null; problem: string | null }[];
  /** `key: value` lines found before the header row, keys as written. */
  preamble: Record<string, string>;
  deviceSerial: string | null;
  deviceName: string | null;
}

export interface ParsedRide {
  ok: true;
  summary: RideSummary;
  series: RideSeries;
  metadata: RideMetadata;
}

export interface ParseOptions {
  profile?: ImportProfile;
  /** Metres per crank revolution when the file has no distance column; default 2.0. */
  metresPerRev?: number;
  /** Byte limit; larger input is refused with `too_large`. Default 25 MB. */
  maxBytes?: number;
  /**
   * IANA time zone (e.g. "Europe/Berlin") for date-times written without a UTC
   * offset, usually the client's. Without it such times are read as UTC, with a warning.
   */
  timeZone?: string;
}
