// The stored form of a session's sample series: one compact binary value per
// session. Each column is quantised to 0.001 of its canonical unit (ride files
// carry at most a few decimals, so this keeps what the file said),
// delta-encoded, zigzagged, byte-shuffled and deflated. Smooth signals and
// constant columns (pulse width, frequency, phase) shrink to almost nothing.
// The storage benchmark (scripts/bench-ingest.ts) compares this with a row per
// sample and with PostgreSQL arrays; DEVELOPERS.md has the figures.
import { deflateRawSync, inflateRawSync } from 'node:zlib';
import type { ChannelName, Phase, RideSeries } from './types';

export const SERIES_FORMAT = 1;

const PHASES: Phase[] = ['passive', 'active', 'cooldown'];
const SCALE = 1000;
type ScalarKey = 'cadenceRpm' | 'powerW' | 'distanceM' | 'heartRateBpm' | 'pulseWidthUs' | 'frequencyHz';
const SCALARS: ScalarKey[] = ['cadenceRpm', 'powerW', 'distanceM', 'heartRateBpm', 'pulseWidthUs', 'frequencyHz'];

interface ColumnHeader {
  name: string;
  scale: number;
  nan: boolean;
}
interface Header {
  v: number;
  n: number;
  columns: ColumnHeader[];
}

function columnsOf(series: RideSeries): { name: string; scale: number; values: ArrayLike<number> }[] {
  const cols: { name: string; scale: number; values: ArrayLike<number> }[] = [
    { name: 't', scale: SCALE, values: series.t },
    { name: 'phase', scale: 1, values: Int8Array.from(series.phase, (p) => PHASES.indexOf(p)) },
  ];
  for (const key of SCALARS) {
    const values = series[key];
    if (values) cols.push({ name: key, scale: SCALE, values });
  }
  for (const [name, values] of Object.entries(series.channels)) {
    if (values) cols.push({ name: `ch:${name}`, scale: SCALE, values });
  }
  return cols;
}

export function encodeSeries(series: RideSeries): Uint8Array {
  const n = series.t.length;
  const cols = columnsOf(series);
  const header: Header = { v: SERIES_FORMAT, n, columns: [] };
  const maskBytes = Math.ceil(n / 8);
  const parts: Uint8Array[] = [];
  const zig = new Uint32Array(n);
  for (const col of cols) {
    const scale = fitScale(col.values, col.scale);
    let prev = 0;
    let nan = false;
    const mask = new Uint8Array(maskBytes);
    for (let i = 0; i < n; i++) {
      const v = col.values[i];
      let q: number;
      if (Number.isNaN(v)) {
        nan = true;
        mask[i >> 3] |= 1 << (i & 7);
        // A missing value repeats the previous one, so its delta is zero.
        q = prev;
      } else {
        q = Math.round(v * scale);
      }
      const d = q - prev;
      prev = q;
      zig[i] = d >= 0 ? d * 2 : -d * 2 - 1;
    }
    header.columns.push({ name: col.name, scale, nan });
    parts.push(shuffle(zig));
    if (nan) parts.push(mask);
  }
  // Level 4: a tenth of the time of the default level for 6 % more bytes (bench:ingest).
  const body = deflateRawSync(concat(parts), { level: 4 });
  const head = new TextEncoder().encode(JSON.stringify(header));
  const out = new Uint8Array(4 + head.length + body.length);
  new DataView(out.buffer).setUint32(0, head.length, true);
  out.set(head, 4);
  out.set(body, 4 + head.length);
  return out;
}

export function decodeSeries(bytes: Uint8Array): RideSeries {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const headLen = view.getUint32(0, true);
  const header = JSON.parse(new TextDecoder().decode(bytes.subarray(4, 4 + headLen))) as Header;
  if (header.v !== SERIES_FORMAT) throw new Error(`unknown series format ${header.v}`);
  const body = inflateRawSync(bytes.subarray(4 + headLen));
  const n = header.n;
  const maskBytes = Math.ceil(n / 8);
  const series: RideSeries = { t: new Float64Array(n), phase: new Array(n), channels: {} };
  let offset = 0;
  const zig = new Uint32Array(n);
  for (const col of header.columns) {
    unshuffle(body.subarray(offset, offset + n * 4), zig);
    offset += n * 4;
    const mask = col.nan ? body.subarray(offset, offset + maskBytes) : null;
    if (mask) offset += maskBytes;
    const out = new Float64Array(n);
    let q = 0;
    for (let i = 0; i < n; i++) {
      const z = zig[i];
      q += z & 1 ? -(z + 1) / 2 : z / 2;
      out[i] = mask && mask[i >> 3] & (1 << (i & 7)) ? NaN : q / col.scale;
    }
    if (col.name === 't') series.t = out;
    else if (col.name === 'phase') series.phase = Array.from(out, (p) => PHASES[p]);
    else if (col.name.startsWith('ch:')) series.channels[col.name.slice(3) as ChannelName] = out;
    else series[col.name as ScalarKey] = out;
  }
  return series;
}

// Deltas must fit 32 bits after zigzag, so quantised values stay below 2^30 in
// magnitude; a column with larger values (a distance in the thousands of
// kilometres) is stored with fewer decimals instead of failing.
const LIMIT = 2 ** 30;
function fitScale(values: ArrayLike<number>, preferred: number): number {
  let max = 0;
  for (let i = 0; i < values.length; i++) {
    const a = Math.abs(values[i]);
    if (a > max) max = a;
  }
  let scale = preferred;
  while (max * scale >= LIMIT && scale > 1e-9) scale /= 10;
  return scale;
}

/** Byte-transposes 32-bit values: all first bytes, then all second bytes, …, so small values leave long runs of zeros. */
function shuffle(values: Uint32Array): Uint8Array {
  const n = values.length;
  const out = new Uint8Array(n * 4);
  for (let i = 0; i < n; i++) {
    const v = values[i];
    out[i] = v & 0xff;
    out[n + i] = (v >>> 8) & 0xff;
    out[2 * n + i] = (v >>> 16) & 0xff;
    out[3 * n + i] = v >>> 24;
  }
  return out;
}

function unshuffle(bytes: Uint8Array, out: Uint32Array): void {
  const n = out.length;
  for (let i = 0; i < n; i++) {
    out[i] = (bytes[i] | (bytes[n + i] << 8) | (bytes[2 * n + i] << 16) | (bytes[3 * n + i] << 24)) >>> 0;
  }
}

function concat(parts: Uint8Array[]): Uint8Array {
  const out = new Uint8Array(parts.reduce((s, p) => s + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}
