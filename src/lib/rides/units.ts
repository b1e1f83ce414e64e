// Units a ride file may state for each quantity, and how to reach Kinloop's
// canonical unit (s, rpm, W, m, mA, µs, Hz, bpm). Factors follow the SI
// prefixes (kilo = 10^3, milli = 10^-3, micro = 10^-6; BIPM SI Brochure) and
// the international mile of exactly 1609.344 m (1959 agreement, NIST SP 811).

export type Quantity =
  | 'time'
  | 'cadence'
  | 'power'
  | 'distance'
  | 'current'
  | 'pulse_width'
  | 'frequency'
  | 'heart_rate';

/** canonical value = value × multiply ÷ divide (time divides so that whole milliseconds stay exact). */
export interface Unit {
  symbol: string;
  multiply: number;
  divide: number;
}

const unit = (symbol: string, multiply = 1, divide = 1): Unit => ({ symbol, multiply, divide });

const SECOND = unit('s');
const MILLISECOND = unit('ms', 1, 1000);
const RPM = unit('rpm');
const WATT = unit('W');
const KILOWATT = unit('kW', 1000);
const METRE = unit('m');
const KILOMETRE = unit('km', 1000);
const MILE = unit('mi', 1609.344);
const MILLIAMPERE = unit('mA');
const AMPERE = unit('A', 1000);
const MICROSECOND = unit('µs');
const PULSE_MILLISECOND = unit('ms', 1000);
const HERTZ = unit('Hz');
const BPM = unit('bpm');

const spellings = (u: Unit, ...keys: string[]): [string, Unit][] => keys.map((k) => [k, u]);

const TABLE: Record<Quantity, Map<string, Unit>> = {
  time: new Map([
    ...spellings(SECOND, 's', 'sec', 'secs', 'second', 'seconds'),
    ...spellings(MILLISECOND, 'ms', 'msec', 'millisecond', 'milliseconds'),
  ]),
  cadence: new Map(spellings(RPM, 'rpm', 'revmin', 'rmin', '1min', 'min1')),
  power: new Map([
    ...spellings(WATT, 'w', 'watt', 'watts'),
    ...spellings(KILOWATT, 'kw', 'kilowatt', 'kilowatts'),
  ]),
  distance: new Map([
    ...spellings(METRE, 'm', 'metre', 'metres', 'meter', 'meters'),
    ...spellings(KILOMETRE, 'km', 'kilometre', 'kilometres', 'kilometer', 'kilometers'),
    ...spellings(MILE, 'mi', 'mile', 'miles'),
  ]),
  current: new Map([
    ...spellings(MILLIAMPERE, 'ma', 'milliamp', 'milliamps', 'milliampere', 'milliamperes'),
    ...spellings(AMPERE, 'a', 'amp', 'amps', 'ampere', 'amperes'),
  ]),
  pulse_width: new Map([
    ...spellings(MICROSECOND, 'us', 'microsecond', 'microseconds'),
    ...spellings(PULSE_MILLISECOND, 'ms', 'millisecond', 'milliseconds'),
  ]),
  frequency: new Map(spellings(HERTZ, 'hz', 'hertz')),
  heart_rate: new Map(spellings(BPM, 'bpm', 'beatsmin', '1min', 'min1')),
};

const DEFAULTS: Record<Quantity, Unit> = {
  time: SECOND,
  cadence: RPM,
  power: WATT,
  distance: METRE,
  current: MILLIAMPERE,
  pulse_width: MICROSECOND,
  frequency: HERTZ,
  heart_rate: BPM,
};

/** Lower case, micro sign and Greek mu as "u", punctuation and spaces removed: "µs" → "us", "rev/min" → "revmin". */
export function unitKey(text: string): string {
  return text
    .normalize('NFKC')
    .toLowerCase()
    .replace(/μ/g, 'u')
    .replace(/[^a-z0-9]/g, '');
}

export function findUnit(quantity: Quantity, text: string): Unit | null {
  return TABLE[quantity].get(unitKey(text)) ?? null;
}

export function defaultUnit(quantity: Quantity): Unit {
  return DEFAULTS[quantity];
}

/** True when the text is a unit of any quantity (used to tell "power_w" from "power_avg"). */
export function isUnitWord(text: string): boolean {
  const key = unitKey(text);
  return key !== '' && Object.values(TABLE).some((m) => m.has(key));
}

export function isIdentity(u: Unit): boolean {
  return u.multiply === 1 && u.divide === 1;
}
