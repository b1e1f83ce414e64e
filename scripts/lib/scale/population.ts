// An invented population for the scale benchmarks: a regional service's
// clinics, staff, carers and riders, with two years of home sessions. Pure
// (no I/O, `now` passed in) and seeded, so the same options give the same
// people and sessions. Every name and number is made up. The riding follows
// the demo story's rules (src/lib/demo/ride-story.ts): sessions grow from
// about 26 minutes, power rises towards each rider's own level, currents
// settle at about 70 % of the prescribed maximum; the ride files of the
// sampled sessions come from the demo's own generator.
import { DateTime } from 'luxon';
import type { AdRisk, Diagnosis } from '../../../src/lib/db/tables';
import { between, integerBetween, mulberry32, normal, seedOf, type Random } from '../../../src/lib/demo/prng';
import type { NamedChannel, RideSpec } from '../../../src/lib/demo/ride-generator';
import type { LayoutKey } from '../../../src/lib/demo/ride-layouts';
import { localDate } from '../../../src/lib/time/local-date';

export interface PopulationOptions {
  /** Clients of the main clinic (the demo's, when it is seeded). */
  clients: number;
  years: number;
  /** Further clinics, each with a twentieth of `clients` (at least one). */
  otherClinics: number;
  seed: number;
  now: Date;
}

export interface PlannedUser {
  id: string;
  email: string;
  name: string;
}

export interface PlannedClinic {
  key: string;
  name: string;
  timeZone: string;
  /** Existing clinic id (the demo's) or null for a new one. */
  existingId: string | null;
  admin: PlannedUser;
  therapists: PlannedUser[];
  zones: [string, number][];
  clients: number;
}

export type Story = 'steady' | 'power_drop' | 'current_rise' | 'short' | 'stopped' | 'missed_week' | 'archived';

export interface PlannedVersion {
  effectiveFrom: string;
  sessionsPerWeek: number;
  minutesPerSession: number;
  weekdays: number[];
  resistance: number;
  notes: string;
}

export interface PlannedPause {
  from: string;
  to: string;
  reason: string;
}

export interface PlannedClient {
  index: number;
  clinicKey: string;
  therapist: PlannedUser;
  name: string;
  dateOfBirth: string;
  diagnosis: Diagnosis;
  injuryLevel: string | null;
  aisGrade: string | null;
  adRisk: AdRisk;
  timeZone: string;
  bodyMassKg: number;
  programStart: string;
  /** The therapist's value, when set. */
  baselineSystolic: number | null;
  /** The rider's usual resting systolic pressure, around which readings scatter. */
  restingSystolic: number;
  layout: LayoutKey;
  hz: number;
  serial: string | null;
  account: PlannedUser | null;
  story: Story;
  archivedOn: string | null;
  versions: PlannedVersion[];
  pauses: PlannedPause[];
  cadenceRpm: number;
  startMinute: number;
  power: { startW: number; topW: number; tauDays: number };
  extraMinutes: number;
  maxCurrentsMa: Partial<Record<NamedChannel, number>>;
  restingHeartRateBpm: number;
  /** Chance that a due session is skipped. */
  skip: number;
  /** Share of sessions with a pre/post check. */
  checkRate: number;
  goalRoute: string | null;
  seed: number;
}

export interface PlannedCarer {
  user: PlannedUser;
  links: { clientIndex: number; relationship: string }[];
}

export interface PlannedSession {
  date: string;
  spec: RideSpec;
  /** Whole session shortened on purpose (tiredness, a spasm). */
  short: boolean;
}

export interface Population {
  clinics: PlannedClinic[];
  clients: PlannedClient[];
  carers: PlannedCarer[];
}

const FIRST = ['Aino', 'Bram', 'Cato', 'Dalia', 'Eamon', 'Farah', 'Gideon', 'Hana', 'Ivo', 'Jolene', 'Kasper', 'Lior', 'Maelle', 'Nikos', 'Orla', 'Pavel', 'Quinn', 'Rosalind', 'Soren', 'Tamsin', 'Ulla', 'Vikram', 'Wilma', 'Xavi', 'Yara', 'Zoltan', 'Amara', 'Bastian', 'Cerys', 'Dmitri', 'Esme', 'Fintan', 'Greta', 'Hamish', 'Ines', 'Joaquin', 'Keira', 'Lucan', 'Mireille', 'Niamh', 'Oskar', 'Priyanka', 'Rune', 'Saoirse', 'Tobias', 'Una', 'Valentin', 'Wendeline', 'Yusuf', 'Zelda', 'Anouk', 'Benedikt', 'Calla', 'Desmond', 'Elif', 'Florian', 'Gwen', 'Henrik', 'Isolde', 'Jasper'];
const LAST = ['Abernethy', 'Bellweather', 'Castellane', 'Dunmore', 'Eskdale', 'Fairbairn', 'Glenholm', 'Hartigan', 'Ingleby', 'Jarrow', 'Kilbride', 'Lochrie', 'Marchbank', 'Northcote', 'Ottley', 'Penhallow', 'Quarrier', 'Rathmore', 'Strachan', 'Tregarth', 'Underhill', 'Vantongeren', 'Whitlow', 'Yelland', 'Zabinski', 'Ashdown', 'Brackley', 'Corrigan', 'Delacourt', 'Elsworth', 'Farquhar', 'Grantley', 'Holroyd', 'Ibbotson', 'Kerrigan', 'Lindqvist', 'Maddox', 'Nethercott', 'Oyelaran', 'Pendry', 'Rowntree', 'Sallis', 'Thistlewood', 'Ulverston', 'Varley', 'Wolstenholme', 'Achterberg', 'Bramwell', 'Cuthbertson', 'Dryden', 'Everleigh', 'Fennimore', 'Gaskell', 'Hollander', 'Iredale', 'Jessop', 'Kowalczyk', 'Leverett', 'Montague', 'Nakashima'];
const RELATIONSHIPS = ['partner', 'parent', 'daughter', 'son', 'support worker', 'sibling', 'friend'];
const PAUSE_REASONS = ['Holiday', 'Chest infection', 'Cycle away for repair', 'Hospital appointment and recovery', 'Pressure area healing', 'Family visit abroad', 'Respite stay'];
const ROUTES = ['sussex-shore', 'lake-loop', 'danube-valley', 'long-white-cloud'];
const SCI_LEVELS = ['C4', 'C5', 'C6', 'C7', 'T1', 'T3', 'T4', 'T6', 'T8', 'T10', 'T12', 'L1', 'L2'];

const OTHER_CLINICS: { name: string; timeZone: string; zones: [string, number][] }[] = [
  { name: 'Tamarack Point Rehabilitation', timeZone: 'America/Toronto', zones: [['America/Toronto', 0.7], ['America/Halifax', 0.2], ['America/Winnipeg', 0.1]] },
  { name: 'Kestrel Ridge Spinal Outreach', timeZone: 'Australia/Perth', zones: [['Australia/Perth', 0.8], ['Australia/Adelaide', 0.2]] },
  { name: 'Heatherbrook Community Neuro Team', timeZone: 'Europe/Dublin', zones: [['Europe/Dublin', 1]] },
];
export const MAIN_CLINIC = { name: 'Fellgate Regional Neuro Service', timeZone: 'Europe/London' };
const MAIN_ZONES: [string, number][] = [['Europe/London', 0.8], ['Europe/Dublin', 0.1], ['Europe/Lisbon', 0.05], ['Europe/Berlin', 0.05]];

/** Clients per therapist, as a busy community team might carry. */
const CASELOAD_PER_THERAPIST = 25;

const WEEKDAY_PATTERNS: Record<number, number[][]> = {
  2: [[1, 4], [2, 5], [3, 6], [1, 5]],
  3: [[1, 3, 5], [2, 4, 6], [1, 3, 6], [2, 4, 7], [2, 5, 7]],
  4: [[1, 2, 4, 5], [1, 3, 5, 7], [2, 3, 5, 6]],
  5: [[1, 2, 3, 4, 5], [1, 2, 4, 5, 6], [1, 3, 4, 6, 7]],
};

// As in the demo story: a warm-up and cool-down around the stimulated phase,
// sessions from about 26 minutes gaining 0.6 a day, currents from half to
// 70 % of the maximum over the first weeks, 300 µs at 35 Hz.
const WARMUP_MIN = 5;
const COOLDOWN_MIN = 4;
const START_MINUTES = 26;
const MINUTES_PER_DAY = 0.6;
const CURRENT_FROM = 0.5;
const CURRENT_TO = 0.7;
const CURRENT_TAU_DAYS = 21;
const PULSE_WIDTH_US = 300;
const FREQUENCY_HZ = 35;
const LAYOUT_HZ: Record<LayoutKey, number> = { A: 1, B: 2, C: 1 };

function pick<T>(random: Random, items: readonly T[]): T {
  return items[Math.floor(random() * items.length)];
}

function weighted<T>(random: Random, items: readonly [T, number][]): T {
  let r = random() * items.reduce((s, [, w]) => s + w, 0);
  for (const [item, w] of items) {
    r -= w;
    if (r < 0) return item;
  }
  return items[items.length - 1][0];
}

const DAY_MS = 86_400_000;
export const dayNumber = (date: string) => Date.parse(`${date}T00:00:00Z`) / DAY_MS;
export const dateOf = (day: number) => new Date(day * DAY_MS).toISOString().slice(0, 10);
/** ISO weekday, 1 = Monday. */
export const weekdayOf = (day: number) => ((new Date(day * DAY_MS).getUTCDay() + 6) % 7) + 1;

const offsets = new Map<string, number>();
/** UTC offset in minutes at midday of a local date (rides are in the day, away from DST changes at night). */
function offsetOn(zone: string, date: string): number {
  const key = `${zone} ${date}`;
  let offset = offsets.get(key);
  if (offset === undefined) {
    offset = DateTime.fromISO(`${date}T12:00:00`, { zone }).offset;
    offsets.set(key, offset);
  }
  return offset;
}

/** "2026-05-03", 570 min, +60 → "2026-05-03T09:30:00+01:00", as the demo's wallTime writes it. */
function wallTime(date: string, minuteOfDay: number, zone: string): string {
  const offset = offsetOn(zone, date);
  const pad = (n: number) => String(n).padStart(2, '0');
  const sign = offset < 0 ? '-' : '+';
  const a = Math.abs(offset);
  return `${date}T${pad(Math.floor(minuteOfDay / 60))}:${pad(minuteOfDay % 60)}:00${sign}${pad(Math.floor(a / 60))}:${pad(a % 60)}`;
}

function user(kind: string, n: number, clinicKey: string, name: string): PlannedUser {
  return { id: '', email: `${kind}${String(n).padStart(4, '0')}.${clinicKey}@scale.kinloop.test`, name };
}

/** Distinct invented names, as many as asked (numbered once the pairs run out). */
function names(random: Random, count: number): string[] {
  const pairs: string[] = [];
  for (const f of FIRST) for (const l of LAST) pairs.push(`${f} ${l}`);
  for (let i = pairs.length - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    [pairs[i], pairs[j]] = [pairs[j], pairs[i]];
  }
  return Array.from({ length: count }, (_, i) => (i < pairs.length ? pairs[i] : `${pairs[i % pairs.length]} ${Math.floor(i / pairs.length) + 1}`));
}

export function planPopulation(options: PopulationOptions, mainClinic: { id: string; name: string; timeZone: string } | null): Population {
  const random = mulberry32(seedOf(`scale:${options.seed}:people`));
  const others = Array.from({ length: options.otherClinics }, (_, i) => OTHER_CLINICS[i % OTHER_CLINICS.length]);
  const sizes = [options.clients, ...others.map(() => Math.max(1, Math.round(options.clients / 20)))];
  const total = sizes.reduce((a, b) => a + b, 0);
  const allNames = names(random, total + 200);
  let nameAt = 0;
  const clinics: PlannedClinic[] = [
    { key: 'main', name: mainClinic?.name ?? MAIN_CLINIC.name, timeZone: mainClinic?.timeZone ?? MAIN_CLINIC.timeZone, existingId: mainClinic?.id ?? null, zones: MAIN_ZONES, clients: sizes[0] } as PlannedClinic,
    ...others.map((c, i) => ({ key: `c${i + 1}`, name: others.length > OTHER_CLINICS.length ? `${c.name} ${i + 1}` : c.name, timeZone: c.timeZone, existingId: null, zones: c.zones, clients: sizes[i + 1] }) as PlannedClinic),
  ];
  for (const clinic of clinics) {
    clinic.admin = user('admin', 1, clinic.key, allNames[nameAt++]);
    clinic.therapists = Array.from({ length: Math.ceil(clinic.clients / CASELOAD_PER_THERAPIST) }, (_, i) => user('therapist', i + 1, clinic.key, allNames[nameAt++]));
  }

  const clients: PlannedClient[] = [];
  const carers: PlannedCarer[] = [];
  const today = localDate(options.now, 'UTC');
  const spanDays = Math.round(options.years * 365);
  for (const clinic of clinics) {
    let lastCarer: PlannedCarer | null = null;
    for (let k = 0; k < clinic.clients; k++) {
      const index = clients.length;
      const seed = seedOf(`scale:${options.seed}:client:${index}`);
      const r = mulberry32(seed);
      const diagnosis = weighted<Diagnosis>(r, [['sci', 0.45], ['ms', 0.2], ['stroke', 0.2], ['cerebral_palsy', 0.07], ['other', 0.08]]);
      const injuryLevel = diagnosis === 'sci' ? pick(r, SCI_LEVELS) : null;
      const high = injuryLevel !== null && (injuryLevel.startsWith('C') || ['T1', 'T3', 'T4', 'T6'].includes(injuryLevel));
      const adRisk: AdRisk = diagnosis === 'sci' ? (r() < 0.1 ? 'unknown' : high ? 'at_risk' : 'not_at_risk') : r() < 0.05 ? 'unknown' : 'not_at_risk';
      const timeZone = weighted(r, clinic.zones);
      // Most started at the beginning of the period; some joined since, a few only weeks ago.
      const startedDaysAgo = weighted(r, [
        [integerBetween(r, Math.max(30, spanDays - 60), spanDays), 0.9],
        [integerBetween(r, 60, Math.max(61, spanDays - 60)), 0.07],
        [integerBetween(r, 14, 60), 0.03],
      ]);
      const programStart = dateOf(dayNumber(today) - startedDaysAgo);
      const layout = weighted<LayoutKey>(r, [['A', 0.45], ['B', 0.3], ['C', 0.25]]);
      const sixChannels = layout === 'A' || (layout === 'C' && r() < 0.5);
      const quad = integerBetween(r, 70, 125);
      const ham = quad - integerBetween(r, 5, 15);
      const glute = ham - integerBetween(r, 5, 15);
      const maxCurrentsMa: Partial<Record<NamedChannel, number>> = sixChannels
        ? { quadriceps_left: quad, quadriceps_right: quad, hamstrings_left: ham, hamstrings_right: ham, gluteals_left: glute, gluteals_right: glute }
        : { quadriceps_left: quad, quadriceps_right: quad, hamstrings_left: ham, hamstrings_right: ham };
      const drawn = weighted<Story>(r, [['steady', 0.75], ['power_drop', 0.06], ['current_rise', 0.04], ['short', 0.04], ['stopped', 0.05], ['missed_week', 0.04], ['archived', 0.02]]);
      // Only a client with months of riding leaves the program.
      const story = drawn === 'archived' && startedDaysAgo < 150 ? 'steady' : drawn;
      const archivedOn = story === 'archived' ? dateOf(dayNumber(today) - integerBetween(r, 60, Math.max(61, Math.min(400, startedDaysAgo - 30)))) : null;
      const hasCarer = r() < 0.45;
      let carerUser: PlannedCarer | null = null;
      if (hasCarer) {
        if (lastCarer && r() < 0.1) carerUser = lastCarer;
        else {
          carerUser = { user: user('carer', carers.length + 1, clinic.key, allNames[nameAt++ % allNames.length]), links: [] };
          carers.push(carerUser);
        }
        carerUser.links.push({ clientIndex: index, relationship: pick(r, RELATIONSHIPS) });
        lastCarer = carerUser;
      }
      const name = allNames[nameAt++ % allNames.length];
      const client: PlannedClient = {
        index,
        clinicKey: clinic.key,
        therapist: clinic.therapists[k % clinic.therapists.length],
        name,
        dateOfBirth: dateOf(dayNumber('1945-01-01') + integerBetween(r, 0, 60 * 365)),
        diagnosis,
        injuryLevel,
        aisGrade: injuryLevel ? pick(r, ['A', 'B', 'C', 'D']) : null,
        adRisk,
        timeZone,
        bodyMassKg: Math.round(between(r, 48, 105) * 10) / 10,
        programStart,
        restingSystolic: high ? integerBetween(r, 92, 112) : integerBetween(r, 108, 135),
        baselineSystolic: null,
        layout,
        hz: LAYOUT_HZ[layout],
        serial: layout === 'C' ? null : `${layout === 'A' ? 'KBA' : 'DST'}-${String(10_000 + index).padStart(5, '0')}`,
        account: r() < 0.3 ? user('rider', index + 1, clinic.key, name) : null,
        story,
        archivedOn,
        versions: [],
        pauses: [],
        cadenceRpm: integerBetween(r, 38, 48),
        startMinute: integerBetween(r, 8 * 12, 19 * 12) * 5,
        power: { startW: between(r, 2, 6), topW: between(r, 12, 45), tauDays: between(r, 40, 70) },
        extraMinutes: integerBetween(r, 0, 8),
        maxCurrentsMa,
        restingHeartRateBpm: integerBetween(r, 56, 82),
        skip: weighted(r, [[between(r, 0.02, 0.08), 0.6], [between(r, 0.08, 0.2), 0.3], [between(r, 0.2, 0.35), 0.1]]),
        checkRate: adRisk === 'at_risk' ? between(r, 0.4, 0.8) : r() < 0.5 ? between(r, 0.05, 0.2) : 0,
        goalRoute: r() < 0.25 ? pick(r, ROUTES) : null,
        seed,
      };
      client.baselineSystolic = adRisk === 'at_risk' && r() < 0.6 ? client.restingSystolic : null;
      client.versions = planVersions(client, r, today);
      client.pauses = planPauses(client, r, today);
      clients.push(client);
    }
  }
  return { clinics, clients, carers };
}

function planVersions(c: PlannedClient, r: Random, today: string): PlannedVersion[] {
  const sessions = weighted(r, [[2, 0.1], [3, 0.45], [4, 0.3], [5, 0.15]]);
  const first: PlannedVersion = {
    effectiveFrom: c.programStart,
    sessionsPerWeek: sessions,
    minutesPerSession: 30,
    weekdays: pick(r, WEEKDAY_PATTERNS[sessions]),
    resistance: integerBetween(r, 1, 2),
    notes: 'First weeks: build up from about 25 minutes as tolerated, warm-up included.',
  };
  const versions = [first];
  const longerFrom = dateOf(dayNumber(c.programStart) + integerBetween(r, 35, 49));
  if (longerFrom <= today) {
    const minutes = pick(r, [40, 45, 50]);
    versions.push({ ...first, effectiveFrom: longerFrom, minutesPerSession: minutes, resistance: first.resistance + 1, notes: `Sessions lengthened to ${minutes} minutes now that 30 are well tolerated.` });
    const span = dayNumber(today) - dayNumber(longerFrom);
    if (span > 150 && r() < 0.4) {
      const last = versions[versions.length - 1];
      const changed = Math.min(5, Math.max(2, last.sessionsPerWeek + (r() < 0.5 ? -1 : 1)));
      if (changed !== last.sessionsPerWeek) {
        versions.push({
          ...last,
          effectiveFrom: dateOf(dayNumber(longerFrom) + integerBetween(r, 90, span - 30)),
          sessionsPerWeek: changed,
          weekdays: pick(r, WEEKDAY_PATTERNS[changed]),
          notes: `${changed} sessions a week from now on, agreed at the review.`,
        });
      }
    }
  }
  return versions;
}

function planPauses(c: PlannedClient, r: Random, today: string): PlannedPause[] {
  const pauses: PlannedPause[] = [];
  const first = dayNumber(c.programStart) + 30;
  const last = dayNumber(today) - 14;
  const count = last - first < 60 ? 0 : weighted(r, [[0, 0.55], [1, 0.3], [2, 0.12], [3, 0.03]]);
  for (let attempt = 0; pauses.length < count && attempt < 20; attempt++) {
    const from = integerBetween(r, first, last - 21);
    const to = from + integerBetween(r, 6, 20);
    if (pauses.some((p) => !(to < dayNumber(p.from) - 7 || from > dayNumber(p.to) + 7))) continue;
    pauses.push({ from: dateOf(from), to: dateOf(to), reason: pick(r, PAUSE_REASONS) });
  }
  // A few are on a break right now.
  if (c.story === 'steady' && r() < 0.03) {
    pauses.push({ from: dateOf(dayNumber(today) - integerBetween(r, 2, 9)), to: dateOf(dayNumber(today) + integerBetween(r, 5, 20)), reason: 'Hospital stay' });
  }
  return pauses.sort((a, b) => a.from.localeCompare(b.from));
}

function versionOn(c: PlannedClient, date: string): PlannedVersion {
  let v = c.versions[0];
  for (const x of c.versions) if (x.effectiveFrom <= date) v = x;
  return v;
}

const round1 = (x: number) => Math.round(x * 10) / 10;

function scaleCurrents(currents: Partial<Record<NamedChannel, number>>, factor: number): Partial<Record<NamedChannel, number>> {
  return Object.fromEntries(Object.entries(currents).map(([ch, v]) => [ch, round1(v * factor)]));
}

/** A client's sessions, oldest first, each ending before `now`. */
export function clientSessions(c: PlannedClient, now: Date): PlannedSession[] {
  const r = mulberry32(c.seed ^ 0x5e55);
  const today = localDate(now, c.timeZone);
  const end = c.archivedOn ?? today;
  const firstRide = dayNumber(c.programStart) + integerBetween(r, 0, 6);
  const lapses = new Set<number>();
  const out: PlannedSession[] = [];
  for (let day = firstRide; day <= dayNumber(end); day++) {
    const date = dateOf(day);
    const weekday = weekdayOf(day);
    const monday = day - weekday + 1;
    if (weekday === 1 && r() < 0.02) lapses.add(monday);
    const version = versionOn(c, date);
    const due = version.weekdays.includes(weekday);
    if (!due && r() > 0.01) continue;
    if (lapses.has(monday) || r() < c.skip) continue;
    if (c.pauses.some((p) => date >= p.from && date <= p.to)) continue;
    const ridden = day - firstRide;
    const short = r() < 0.02;
    const cap = version.minutesPerSession + c.extraMinutes;
    const total = Math.min(cap, Math.floor(START_MINUTES + MINUTES_PER_DAY * ridden)) + integerBetween(r, -1, 1);
    const level = CURRENT_FROM + (CURRENT_TO - CURRENT_FROM) * (1 - Math.exp(-ridden / CURRENT_TAU_DAYS));
    const trend = c.power.startW + (c.power.topW - c.power.startW) * (1 - Math.exp(-ridden / c.power.tauDays));
    const seasonal = 1 + 0.04 * Math.sin((2 * Math.PI * day) / 180);
    const activeMin = Math.max(3, (short ? Math.round(total * between(r, 0.45, 0.7)) : total) - WARMUP_MIN - COOLDOWN_MIN);
    const spec: RideSpec = {
      startedAt: wallTime(date, Math.min(23 * 60, Math.max(6 * 60, c.startMinute + 5 * integerBetween(r, -6, 6))), c.timeZone),
      warmupMin: WARMUP_MIN,
      activeMin,
      cooldownMin: COOLDOWN_MIN,
      meanPowerW: round1(trend * seasonal * (1 + 0.03 * normal(r) / 1.7)),
      cadenceRpm: c.cadenceRpm + integerBetween(r, -1, 1),
      currents: scaleCurrents(c.maxCurrentsMa, level * (1 + 0.01 * normal(r))),
      pulseWidthUs: PULSE_WIDTH_US,
      frequencyHz: FREQUENCY_HZ,
      hz: c.hz,
      restingHeartRateBpm: c.restingHeartRateBpm,
      deviceSerial: c.serial ?? undefined,
    };
    if (Date.parse(spec.startedAt) + (WARMUP_MIN + activeMin + COOLDOWN_MIN) * 60_000 > now.getTime()) continue;
    out.push({ date, spec, short });
  }
  return twist(c, out, today, r);
}

/** The end of each client's story, which the flag rules then judge. */
function twist(c: PlannedClient, rides: PlannedSession[], today: string, r: Random): PlannedSession[] {
  const last = (count: number, change: (s: PlannedSession) => RideSpec) => rides.map((s, i) => (i >= rides.length - count ? { ...s, spec: change(s) } : s));
  switch (c.story) {
    case 'power_drop': {
      const factor = between(r, 0.55, 0.75);
      return last(2, ({ spec }) => ({ ...spec, meanPowerW: round1(spec.meanPowerW * factor), currents: scaleCurrents(spec.currents, factor) }));
    }
    case 'current_rise': {
      const factor = between(r, 1.25, 1.4);
      return last(2, ({ spec }) => ({ ...spec, currents: scaleCurrents(spec.currents, factor) }));
    }
    case 'short':
      return last(2, ({ spec }) => ({ ...spec, activeMin: integerBetween(r, 12, 17) }));
    case 'stopped': {
      const from = dateOf(dayNumber(today) - integerBetween(r, 8, 25));
      return rides.filter((s) => s.date < from);
    }
    case 'missed_week': {
      const day = dayNumber(today);
      const monday = day - weekdayOf(day) + 1 - 7;
      return rides.filter((s) => s.date < dateOf(monday) || s.date > dateOf(monday + 6));
    }
    default:
      return rides;
  }
}

export const CHANNEL_LIMITS = { pulseWidthUs: PULSE_WIDTH_US, frequencyHz: FREQUENCY_HZ };
