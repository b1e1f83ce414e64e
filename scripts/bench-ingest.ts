// `npm run bench:ingest`: ingest speed and storage size, as ratios to a floor
// measured in the same run on the same bytes — papaparse alone (header: false)
// with every value converted by Number(). Also compares ways of storing a
// session's series, to keep the choice in DEVELOPERS.md honest.
import Papa from 'papaparse';
import { from as copyFrom } from 'pg-copy-streams';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { closeDatabase, maintenanceKnex } from '../src/lib/data';
import type { ClientRow, UploadRow } from '../src/lib/db/tables';
import { generateRide } from '../src/lib/demo/ride-generator';
import { writeBenchCycleA } from '../src/lib/demo/ride-layouts';
import { saveRide } from '../src/lib/ingest/process';
import { parseRide } from '../src/lib/rides/parse';
import { decodeSeries, encodeSeries } from '../src/lib/rides/series-codec';
import type { ParsedRide, RideSeries } from '../src/lib/rides/types';

const knex = maintenanceKnex();

function rideFile(rows: number): Uint8Array {
  const hz = 10;
  const minutes = rows / hz / 60;
  return writeBenchCycleA(
    generateRide(
      {
        startedAt: '2026-10-05T09:30:00+02:00',
        warmupMin: 5,
        activeMin: minutes - 10,
        cooldownMin: 5,
        meanPowerW: 24,
        cadenceRpm: 42,
        currents: { quadriceps_left: 80, quadriceps_right: 82, hamstrings_left: 60, hamstrings_right: 61, gluteals_left: 55, gluteals_right: 56 },
        pulseWidthUs: 300,
        frequencyHz: 35,
        hz,
        deviceSerial: 'BENCH-0001',
      },
      7,
    ),
  );
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

async function time(runs: number, fn: () => unknown | Promise<unknown>): Promise<number> {
  await fn();
  const out: number[] = [];
  for (let i = 0; i < runs; i++) {
    const start = process.hrtime.bigint();
    await fn();
    out.push(Number(process.hrtime.bigint() - start) / 1e6);
  }
  return median(out);
}

let sink = 0;
function floor(bytes: Uint8Array): void {
  const text = new TextDecoder().decode(bytes);
  const { data } = Papa.parse<string[]>(text, { header: false, skipEmptyLines: true });
  for (const row of data) for (const cell of row) sink += Number(cell) || 0;
}

function parse(bytes: Uint8Array): ParsedRide {
  const parsed = parseRide(bytes, { timeZone: 'Europe/Berlin', maxBytes: 64 * 1024 * 1024 });
  if (!parsed.ok) throw new Error(`bench file refused: ${parsed.error.message}`);
  return parsed;
}

async function fixtureRows() {
  const [clinic] = await knex('clinics').insert({ name: 'Bench clinic' }).returning('id');
  const [user] = await knex('users').insert({ email: `bench-${Date.now()}@example.test`, name: 'Bench' }).returning('id');
  const [client] = await knex<ClientRow>('clients').insert({ clinic_id: clinic.id, display_name: 'Bench rider', time_zone: 'Europe/Berlin' }).returning('*');
  return { client, user: user.id as string };
}

let uploadSeq = 0;
async function newUpload(client: ClientRow, user: string): Promise<UploadRow> {
  const [row] = await knex<UploadRow>('uploads')
    .insert({ client_id: client.id, clinic_id: client.clinic_id, uploaded_by: user, original_name: 'bench.csv', byte_size: '0', sha256: `b${uploadSeq}`, storage_key: `bench/${uploadSeq++}`, status: 'accepted' })
    .returning('*');
  return row;
}

async function relationBytes(tables: string[]): Promise<number> {
  let total = 0;
  for (const t of tables) total += Number((await knex.raw('SELECT pg_total_relation_size(?) AS n', [t])).rows[0].n);
  return total;
}

const fmtMs = (ms: number) => `${ms.toFixed(1)} ms`;
const ratio = (x: number, base: number) => `${(x / base).toFixed(2)}×`;

async function main() {
  const { client, user } = await fixtureRows();
  const results: string[] = [];
  for (const [label, rows, runs] of [
    ['1 h at 10 Hz', 36_000, 15],
    ['300,000 rows', 300_000, 5],
  ] as const) {
    const bytes = rideFile(rows);
    const parsed = parse(bytes);
    const base = await time(runs, () => floor(bytes));
    const parseMs = await time(runs, () => parse(bytes));
    const rideIds: string[] = [];
    const ingestMs = await time(runs, async () => {
      const p = parse(bytes);
      const upload = await newUpload(client, user);
      const id = await knex.transaction((trx) =>
        saveRide(trx, { upload, client, device: null, summary: p.summary, series: encodeSeries(p.series), startedAt: new Date(Date.parse('2026-01-01') + uploadSeq * 86_400_000), source: 'file', warnings: [] }),
      );
      rideIds.push(id);
    });
    const loadId = rideIds[rideIds.length - 1];
    const loadMs = await time(runs, async () => {
      const row = await knex('ride_series').where({ ride_id: loadId }).first('data');
      decodeSeries(row.data);
    });
    const before = await relationBytes(['rides', 'ride_series']);
    const extra: string[] = [];
    for (let i = 0; i < 5; i++) {
      const upload = await newUpload(client, user);
      extra.push(await knex.transaction((trx) => saveRide(trx, { upload, client, device: null, summary: parsed.summary, series: encodeSeries(parsed.series), startedAt: new Date(Date.parse('2027-01-01') + i * 86_400_000 + rows), source: 'file', warnings: [] })));
    }
    const perSession = ((await relationBytes(['rides', 'ride_series'])) - before) / 5;
    results.push(
      `\n${label}: ${parsed.summary.samples.toLocaleString('en')} samples, CSV ${(bytes.length / 1e6).toFixed(2)} MB`,
      `  floor (papaparse + Number)       ${fmtMs(base).padStart(10)}   1.00×`,
      `  Kinloop parse + metrics          ${fmtMs(parseMs).padStart(10)}   ${ratio(parseMs, base)}   (target ≤ 1.5×)`,
      `  full ingest, stored in PostgreSQL ${fmtMs(ingestMs).padStart(9)}   ${ratio(ingestMs, base)}   (target ≤ 2.5×)`,
      `  load one session's full series   ${fmtMs(loadMs).padStart(10)}   ${ratio(loadMs, base)}   (target ≤ 0.25×)`,
      `  disk per session                 ${(perSession / 1024).toFixed(0).padStart(7)} KiB   ${((100 * perSession) / bytes.length).toFixed(1)} % of the CSV   (target ≤ 25 %)`,
    );
    if (rows === 36_000) results.push(...(await storageOptions(parsed.series, bytes.length, base)));
  }
  console.log(results.join('\n'));
  if (sink === 42) console.log('');
}

/** The other ways of storing a series, measured the same way, for the record in DEVELOPERS.md. */
async function storageOptions(series: RideSeries, csvBytes: number, base: number): Promise<string[]> {
  const channels = Object.keys(series.channels) as (keyof RideSeries['channels'])[];
  const cols = ['t', 'phase', 'cadence', 'power', 'distance', 'heart_rate', 'pulse_width', 'frequency', ...channels];
  await knex.raw(`CREATE TABLE bench_samples (ride_id int NOT NULL, ${cols.map((c) => `${c} real`).join(', ')}, PRIMARY KEY (ride_id, t))`);
  await knex.raw(`CREATE TABLE bench_arrays (ride_id int PRIMARY KEY, ${cols.map((c) => `${c} real[]`).join(', ')})`);
  const n = series.t.length;
  const phaseCode = { passive: 0, active: 1, cooldown: 2 } as const;
  const column = (c: string): ArrayLike<number> =>
    c === 't' ? series.t : c === 'phase' ? series.phase.map((p) => phaseCode[p]) : c === 'cadence' ? series.cadenceRpm! : c === 'power' ? series.powerW! : c === 'distance' ? series.distanceM! : c === 'heart_rate' ? series.heartRateBpm! : c === 'pulse_width' ? series.pulseWidthUs! : c === 'frequency' ? series.frequencyHz! : series.channels[c as keyof RideSeries['channels']]!;
  const data = cols.map(column);
  const cell = (v: number) => (Number.isNaN(v) || v === undefined ? '\\N' : String(v));
  let rideId = 0;

  const copyRows = async () => {
    const id = ++rideId;
    const lines: string[] = [];
    for (let i = 0; i < n; i++) lines.push([id, ...data.map((d) => cell(d[i]))].join('\t'));
    const conn = await knex.client.acquireConnection();
    try {
      await pipeline(Readable.from([lines.join('\n') + '\n']), conn.query(copyFrom(`COPY bench_samples (ride_id, ${cols.join(', ')}) FROM STDIN`)));
    } finally {
      await knex.client.releaseConnection(conn);
    }
  };
  const batchRows = async () => {
    const id = ++rideId;
    const rows = Array.from({ length: n }, (_, i) => Object.fromEntries([['ride_id', id], ...cols.map((c, j) => [c, Number.isNaN(data[j][i]) ? null : data[j][i]])]));
    await knex.batchInsert('bench_samples', rows, 1000);
  };
  const arrays = async () => {
    const id = ++rideId;
    await knex('bench_arrays').insert(Object.fromEntries([['ride_id', id], ...cols.map((c, j) => [c, Array.from(data[j], (v) => (Number.isNaN(v) ? null : v))])]));
  };
  const sizeOf = async (table: string, write: () => Promise<void>) => {
    const before = await relationBytes([table]);
    for (let i = 0; i < 3; i++) await write();
    return ((await relationBytes([table])) - before) / 3;
  };
  const out = ['\n  storing one 36,000-sample series, other ways (write, load, disk per session):'];
  for (const [name, table, write, load] of [
    ['row per sample, COPY', 'bench_samples', copyRows, (id: number) => knex('bench_samples').where({ ride_id: id }).orderBy('t')],
    ['row per sample, Knex batch insert', 'bench_samples', batchRows, (id: number) => knex('bench_samples').where({ ride_id: id }).orderBy('t')],
    ['real[] arrays, one row per session', 'bench_arrays', arrays, (id: number) => knex('bench_arrays').where({ ride_id: id }).first()],
  ] as const) {
    const writeMs = await time(3, write);
    const lastId = rideId;
    const loadMs = await time(5, () => load(lastId));
    const bytes = await sizeOf(table, write);
    out.push(`    ${name.padEnd(36)} write ${fmtMs(writeMs).padStart(9)} (${ratio(writeMs, base)})  load ${fmtMs(loadMs).padStart(9)} (${ratio(loadMs, base)})  disk ${(bytes / 1024).toFixed(0).padStart(6)} KiB (${((100 * bytes) / csvBytes).toFixed(0)} % of the CSV)`);
  }
  return out;
}

main()
  .then(() => closeDatabase())
  .catch(async (err) => {
    console.error(err);
    await closeDatabase();
    process.exit(1);
  });
