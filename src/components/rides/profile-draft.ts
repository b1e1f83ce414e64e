// An import profile as the form edits it (strings, rows in order) and as the
// API takes it (a header → field record), with the problems that keep a draft
// from being saved.
import { headerKey } from '../../lib/rides/headers';
import { NAMED_CHANNELS, NUMBERED_CHANNELS, type CanonicalField } from '../../lib/rides/types';
import { channelLabel } from './format';

/** Sent on window when profiles were saved or archived, so other parts of the page refresh their choices. */
export const PROFILES_CHANGED = 'kinloop:import-profiles-changed';

export type TimeFormat = 'seconds' | 'milliseconds' | 'clock' | 'iso';

export interface SavedProfile {
  id: string;
  clinicId: string;
  name: string;
  deviceName: string | null;
  columns: Record<string, { field: CanonicalField; unit?: string }>;
  metresPerRev: number | null;
  timeFormat: TimeFormat | null;
}

export interface DraftRow {
  key: string;
  header: string;
  field: CanonicalField | '';
  unit: string;
}

export interface ProfileDraft {
  name: string;
  deviceName: string;
  rows: DraftRow[];
  metresPerRev: string;
  timeFormat: TimeFormat | '';
}

export interface ProfileMapping {
  columns: Record<string, { field: CanonicalField; unit?: string }>;
  metresPerRev?: number;
  timeFormat?: TimeFormat;
}

export const FIELD_LABELS: Record<CanonicalField, string> = {
  time: 'Time',
  phase: 'Phase',
  cadence: 'Cadence',
  power: 'Power',
  distance: 'Distance',
  pulse_width: 'Pulse width',
  frequency: 'Frequency',
  heart_rate: 'Heart rate',
  ...(Object.fromEntries([...NAMED_CHANNELS, ...NUMBERED_CHANNELS].map((c) => [c, `${channelLabel(c)} current`])) as Record<
    (typeof NAMED_CHANNELS)[number] | (typeof NUMBERED_CHANNELS)[number],
    string
  >),
};

export const TIME_FORMAT_LABELS: Record<TimeFormat | '', string> = {
  '': 'Detect from the values',
  seconds: 'Seconds (e.g. 12.5)',
  milliseconds: 'Milliseconds (e.g. 12500)',
  clock: 'Clock time (mm:ss or h:mm:ss)',
  iso: 'Date and time (ISO 8601)',
};

export function emptyDraft(nextKey: () => string): ProfileDraft {
  return { name: '', deviceName: '', rows: [{ key: nextKey(), header: '', field: '', unit: '' }], metresPerRev: '', timeFormat: '' };
}

export function draftOf(p: SavedProfile, nextKey: () => string): ProfileDraft {
  const rows = Object.entries(p.columns).map(([header, c]) => ({ key: nextKey(), header, field: c.field, unit: c.unit ?? '' }));
  return {
    name: p.name,
    deviceName: p.deviceName ?? '',
    rows: rows.length ? rows : [{ key: nextKey(), header: '', field: '', unit: '' }],
    metresPerRev: p.metresPerRev === null ? '' : String(p.metresPerRev),
    timeFormat: p.timeFormat ?? '',
  };
}


/** The mapping of the draft's complete rows; half-filled rows are left out (and reported by `draftProblems`). */
export function mappingOf(d: ProfileDraft): ProfileMapping {
  const columns: ProfileMapping['columns'] = {};
  for (const r of d.rows) {
    if (!r.header.trim() || !r.field) continue;
    columns[r.header.trim()] = r.unit.trim() ? { field: r.field, unit: r.unit.trim() } : { field: r.field };
  }
  const metres = Number(d.metresPerRev.replace(',', '.'));
  return {
    columns,
    ...(d.metresPerRev.trim() && Number.isFinite(metres) ? { metresPerRev: metres } : {}),
    ...(d.timeFormat ? { timeFormat: d.timeFormat } : {}),
  };
}

export interface RowProblem {
  /** The input the message belongs beside. */
  on: 'header' | 'field';
  message: string;
  /** A row still being filled in: worth showing only once saving was tried. */
  incomplete: boolean;
}

/** Per-row and whole-draft problems, in words the form shows beside the inputs. */
export function draftProblems(d: ProfileDraft): { rows: Record<string, RowProblem>; metresPerRev?: string } {
  const rows: Record<string, RowProblem> = {};
  const seen = new Map<string, number>();
  d.rows.forEach((r, i) => {
    const key = headerKey(r.header);
    if (!key && r.field) rows[r.key] = { on: 'header', message: 'Write the header as it appears in the file.', incomplete: true };
    else if (key && !r.field) rows[r.key] = { on: 'field', message: 'Choose the Kinloop field for this header.', incomplete: true };
    else if (key && seen.has(key)) rows[r.key] = { on: 'header', message: `The same header is already mapped in column ${seen.get(key)! + 1}.`, incomplete: false };
    if (key && !seen.has(key)) seen.set(key, i);
  });
  const text = d.metresPerRev.trim();
  const metres = Number(text.replace(',', '.'));
  const metresPerRev = text && (!Number.isFinite(metres) || metres < 0.1 || metres > 20) ? 'Write a number from 0.1 to 20, such as 2.0.' : undefined;
  return metresPerRev ? { rows, metresPerRev } : { rows };
}

/** Base64 of bytes, in chunks so that large samples do not overflow the argument list. */
export function base64Of(bytes: Uint8Array): string {
  let binary = '';
  for (let i = 0; i < bytes.length; i += 0x8000) binary += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(binary);
}
