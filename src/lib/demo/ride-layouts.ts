// Three invented cycles and the ride files they write, each in a different
// layout that Kinloop's parser reads without an import profile, so that the
// demo shows more than one kind of file:
// - A "Kinloop Bench Cycle A": UTF-8, commas, `key: value` preamble with a
//   start time and serial, elapsed seconds, phase words, distance in metres.
// - B "Demo Stim Trainer": Windows-1252, semicolons with decimal commas, CRLF,
//   two-cell preamble rows, clock times at the ride's rate, no phase column
//   (phases come from the currents), no distance or heart-rate column.
// - C "Community Loan Cycle": UTF-8, tabs, no preamble, an ISO 8601 UTC
//   timestamp on every row, power in kW, distance in km, currents in A,
//   pulse width in ms.
import { NAMED_CHANNELS, type Phase } from '../rides/types';
import type { GeneratedRide, NamedChannel, RideSpec } from './ride-generator';

export type LayoutKey = 'A' | 'B' | 'C';

export interface RideLayout {
  key: LayoutKey;
  deviceName: string;
  write: (ride: GeneratedRide) => Uint8Array;
  fileName: (spec: RideSpec) => string;
}

const POWERS_OF_TEN = [1, 10, 100, 1000, 10000];

/**
 * `value` rounded to `places` (0–4) decimals, written without trailing zeros.
 * Built from integers because a demo plan writes some 20 million cells and
 * String() of a fraction costs about three times as much.
 */
function num(value: number, places: number): string {
  const f = POWERS_OF_TEN[places];
  const n = Math.round(value * f);
  if (n === 0) return '0';
  const a = n < 0 ? -n : n;
  const whole = Math.floor(a / f);
  const sign = n < 0 ? '-' : '';
  let fraction = a - whole * f;
  if (fraction === 0) return `${sign}${whole}`;
  let digits = places;
  while (fraction % 10 === 0) {
    fraction /= 10;
    digits--;
  }
  return `${sign}${whole}.${String(fraction).padStart(digits, '0')}`;
}

/** The ride's channels in Kinloop's channel order. */
function channelsOf(ride: GeneratedRide): [NamedChannel, Float64Array][] {
  return NAMED_CHANNELS.filter((c) => ride.currentsMa[c] !== undefined).map((c) => [c, ride.currentsMa[c]!]);
}

const SIDE_LETTER = { left: 'L', right: 'R' } as const;
const MUSCLE_SHORT = { quadriceps: 'Quad', hamstrings: 'Ham', gluteals: 'Glute' } as const;

function parts(channel: NamedChannel): { muscle: keyof typeof MUSCLE_SHORT; side: keyof typeof SIDE_LETTER } {
  const [muscle, side] = channel.split('_') as [keyof typeof MUSCLE_SHORT, keyof typeof SIDE_LETTER];
  return { muscle, side };
}

/** "2026-05-03T09:30:00+01:00" → "20260503_0930": the local wall time the cycle shows. */
function localStamp(startedAt: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})/.exec(startedAt);
  if (!m) throw new RangeError(`Not an ISO 8601 date-time: ${startedAt}`);
  return `${m[1]}${m[2]}${m[3]}_${m[4]}${m[5]}`;
}

const utf8 = (text: string) => new TextEncoder().encode(text);

/** Windows-1252 bytes of text that keeps to ASCII and Latin-1 letters and signs (where the two agree). */
function windows1252(text: string): Uint8Array {
  const out = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c > 0xff || (c >= 0x80 && c < 0xa0)) throw new RangeError(`No Windows-1252 byte for U+${c.toString(16).padStart(4, '0')} here`);
    out[i] = c;
  }
  return out;
}

/** Fewest decimals that write every sample time of the rate exactly (1 Hz → 0, 2 Hz → 1), at most 3. */
function timePlaces(hz: number): number {
  for (let p = 0; p < 3; p++) if (Number.isInteger(10 ** p / hz)) return p;
  return 3;
}

const A_PHASE: Record<Phase, string> = { passive: 'warm-up', active: 'active', cooldown: 'cool-down' };

export function writeBenchCycleA(ride: GeneratedRide): Uint8Array {
  const { spec } = ride;
  const channels = channelsOf(ride);
  const places = timePlaces(spec.hz);
  const header = [
    'elapsed_s',
    'phase',
    'cadence_rpm',
    'power_w',
    'distance_m',
    ...channels.map(([c]) => {
      const { muscle, side } = parts(c);
      return `${MUSCLE_SHORT[muscle].toLowerCase()}_${SIDE_LETTER[side].toLowerCase()}_ma`;
    }),
    'pulse_width_us',
    'frequency_hz',
    'hr_bpm',
  ];
  const lines = [
    'Kinloop Bench Cycle A ride log',
    'Device: Kinloop Bench Cycle A',
    `Serial: ${spec.deviceSerial ?? 'KBA-0000'}`,
    `Start time: ${spec.startedAt}`,
    `Sample rate: ${spec.hz} Hz`,
    '',
    header.join(','),
  ];
  for (let k = 0; k < ride.t.length; k++) {
    const row = [
      num(ride.t[k], places),
      A_PHASE[ride.phase[k]],
      num(ride.cadenceRpm[k], 1),
      num(ride.powerW[k], 1),
      num(ride.distanceM[k], 1),
      ...channels.map(([, v]) => num(v[k], 0)),
      num(ride.pulseWidthUs[k], 0),
      num(ride.frequencyHz[k], 0),
      num(ride.heartRateBpm[k], 0),
    ];
    lines.push(row.join(','));
  }
  return utf8(`${lines.join('\n')}\n`);
}

/** Seconds as "mm:ss.f" under an hour and "h:mm:ss.f" otherwise (the decimal point becomes a comma later). */
function clock(seconds: number, places: number, withHours: boolean): string {
  const f = 10 ** places;
  const units = Math.round(seconds * f);
  const whole = Math.floor(units / f);
  const fraction = places > 0 ? `.${String(units % f).padStart(places, '0')}` : '';
  const ss = String(whole % 60).padStart(2, '0');
  const mm = String(Math.floor(whole / 60) % 60).padStart(2, '0');
  return withHours ? `${Math.floor(whole / 3600)}:${mm}:${ss}${fraction}` : `${mm}:${ss}${fraction}`;
}

export function writeStimTrainer(ride: GeneratedRide): Uint8Array {
  const { spec } = ride;
  const channels = channelsOf(ride);
  const places = timePlaces(spec.hz);
  const withHours = ride.t.length > 0 && ride.t[ride.t.length - 1] >= 3600;
  const header = [
    withHours ? 'Time (h:mm:ss)' : 'Time (mm:ss)',
    'Cadence [rpm]',
    'Power [W]',
    ...channels.map(([c]) => {
      const { muscle, side } = parts(c);
      return `${MUSCLE_SHORT[muscle]} ${SIDE_LETTER[side]} [mA]`;
    }),
    'PW [µs]',
    'Freq [Hz]',
  ];
  const rows: string[] = [];
  for (let k = 0; k < ride.t.length; k++) {
    const row = [
      clock(ride.t[k], places, withHours),
      num(ride.cadenceRpm[k], 1),
      num(ride.powerW[k], 1),
      ...channels.map(([, v]) => num(v[k], 1)),
      num(ride.pulseWidthUs[k], 0),
      num(ride.frequencyHz[k], 0),
    ];
    rows.push(row.join(';'));
  }
  const preamble = [
    'Demo Stim Trainer session export',
    'Device;Demo Stim Trainer',
    `Serial number;${spec.deviceSerial ?? 'DST-00000'}`,
    `Recorded;${spec.startedAt}`,
    '',
    header.join(';'),
  ];
  const data = rows.join('\r\n').replaceAll('.', ',');
  return windows1252(`${preamble.join('\r\n')}\r\n${data}\r\n`);
}

const C_PHASE: Record<Phase, string> = { passive: 'warmup', active: 'fes', cooldown: 'recovery' };
const C_SIDE = { left: 'Left', right: 'Right' } as const;

/** ISO 8601 in UTC, without milliseconds when they are zero. */
function utcStamp(ms: number): string {
  const iso = new Date(Math.round(ms)).toISOString();
  return iso.endsWith('.000Z') ? `${iso.slice(0, -5)}Z` : iso;
}

export function writeLoanCycle(ride: GeneratedRide): Uint8Array {
  const channels = channelsOf(ride);
  const header = [
    'timestamp',
    'mode',
    'crank rpm',
    'power (kW)',
    'dist (km)',
    ...channels.map(([c]) => {
      const { muscle, side } = parts(c);
      return `${MUSCLE_SHORT[muscle]}${C_SIDE[side]} (A)`;
    }),
    'pw (ms)',
    'stim frequency (Hz)',
    'heart rate (bpm)',
  ];
  const lines = [header.join('\t')];
  for (let k = 0; k < ride.t.length; k++) {
    const row = [
      utcStamp(ride.startedAtMs + ride.t[k] * 1000),
      C_PHASE[ride.phase[k]],
      num(ride.cadenceRpm[k], 0),
      num(ride.powerW[k] / 1000, 4),
      num(ride.distanceM[k] / 1000, 3),
      ...channels.map(([, v]) => num(v[k] / 1000, 4)),
      num(ride.pulseWidthUs[k] / 1000, 3),
      num(ride.frequencyHz[k], 0),
      num(ride.heartRateBpm[k], 0),
    ];
    lines.push(row.join('\t'));
  }
  return utf8(`${lines.join('\n')}\n`);
}

export const RIDE_LAYOUTS: Record<LayoutKey, RideLayout> = {
  A: {
    key: 'A',
    deviceName: 'Kinloop Bench Cycle A',
    write: writeBenchCycleA,
    fileName: (spec) => `${spec.deviceSerial ?? 'KBA-0000'}_${localStamp(spec.startedAt)}.csv`,
  },
  B: {
    key: 'B',
    deviceName: 'Demo Stim Trainer',
    write: writeStimTrainer,
    fileName: (spec) => `session_${localStamp(spec.startedAt)}.csv`,
  },
  C: {
    key: 'C',
    deviceName: 'Community Loan Cycle',
    write: writeLoanCycle,
    fileName: (spec) => `ride-${utcStamp(Date.parse(spec.startedAt)).replaceAll(':', '').replace(/\.\d+Z$/, 'Z')}.tsv`,
  },
};
