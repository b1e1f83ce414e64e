// The cases of `npm run bench:hostile` (scripts/bench-hostile.mjs starts the
// stack): requests and ride files that once cost the server dearly or took
// it down, and a large valid ride. Per case: the HTTP answer and the upload's
// final state, the peak resident memory of the parse processes and of the
// worker during the case (their /proc high-water marks, reset before each
// case), the stored objects it added, and the p99 latency of /api/health
// while it ran divided by the idle p99 measured first in the same run.
import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import { readFile, writeFile } from 'node:fs/promises';
import http from 'node:http';
import net from 'node:net';
import { hashPassword } from '../src/lib/auth/password';
import { config } from '../src/lib/config';
import { closeDatabase, maintenanceKnex } from '../src/lib/data';
import { generateRide } from '../src/lib/demo/ride-generator';
import { writeBenchCycleA } from '../src/lib/demo/ride-layouts';
import { s3 } from '../src/lib/storage/s3';

const base = process.env.KINLOOP_BASE_URL!;
const workerPid = Number(process.env.BENCH_WORKER_PID);
const appPid = Number(process.env.BENCH_APP_PID);
const MiB = 1024 * 1024;
const PASSWORD = 'bench-hostile-2026';
const knex = maintenanceKnex();

// ---------------------------------------------------------------- memory

async function childrenOf(pid: number): Promise<number[]> {
  const text = await readFile(`/proc/${pid}/task/${pid}/children`, 'utf8').catch(() => '');
  return text.trim().split(/\s+/).filter(Boolean).map(Number);
}

/** Peak resident set size since the last reset, in MiB (VmHWM). */
async function peakMiB(pid: number): Promise<number> {
  const status = await readFile(`/proc/${pid}/status`, 'utf8').catch(() => '');
  const kb = Number(/VmHWM:\s+(\d+)/.exec(status)?.[1] ?? 0);
  return kb / 1024;
}

/** CPU seconds a process has used (user + system). */
async function cpuSeconds(pid: number): Promise<number> {
  const stat = await readFile(`/proc/${pid}/stat`, 'utf8').catch(() => '');
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  // utime and stime are fields 14 and 15 of stat(5), in clock ticks (100 a second on Linux).
  return (Number(fields[11]) + Number(fields[12])) / 100;
}

/** Resets the high-water mark (Linux: 5 in clear_refs), so the next reading is this case's peak. */
async function resetPeak(pid: number): Promise<void> {
  await writeFile(`/proc/${pid}/clear_refs`, '5').catch(() => undefined);
}

/** The parse processes and the worker: their pids now, and any that appear while a case runs. */
class MemoryWatch {
  private seen = new Set<number>();
  private parsePeak = 0;
  private timer: NodeJS.Timeout | null = null;

  async start(): Promise<void> {
    this.seen = new Set(await childrenOf(workerPid));
    this.parsePeak = 0;
    await Promise.all([workerPid, ...this.seen].map(resetPeak));
    // A parse process that ends mid-case (a crash) takes its peak with it: sample while it lives.
    this.timer = setInterval(() => void this.sample(), 100);
  }

  private async sample(): Promise<void> {
    for (const pid of await childrenOf(workerPid)) {
      this.seen.add(pid);
      this.parsePeak = Math.max(this.parsePeak, await peakMiB(pid));
    }
  }

  async stop(): Promise<{ parse: number; worker: number }> {
    if (this.timer) clearInterval(this.timer);
    await this.sample();
    return { parse: this.parsePeak, worker: await peakMiB(workerPid) };
  }
}

// ---------------------------------------------------------------- health latency

function p99(samples: number[]): number {
  const s = [...samples].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil(s.length * 0.99) - 1)];
}

async function healthOnce(): Promise<number> {
  const t0 = performance.now();
  const res = await fetch(`${base}/api/health`, { signal: AbortSignal.timeout(30_000) }).catch(() => null);
  await res?.arrayBuffer();
  // No answer within 30 s counts as 30 s.
  return res ? performance.now() - t0 : 30_000;
}

/** Polls /api/health back to back until stopped; returns the latencies. */
function pollHealth(): { stop: () => Promise<number[]> } {
  const samples: number[] = [];
  let running = true;
  const loop = (async () => {
    while (running) {
      samples.push(await healthOnce());
      await new Promise((r) => setTimeout(r, 20));
    }
  })();
  return {
    stop: async () => {
      running = false;
      await loop;
      return samples;
    },
  };
}

// ---------------------------------------------------------------- requests

let cookie = '';
const address = '198.51.100.7';

async function signIn(email: string) {
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base, 'x-forwarded-for': address },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`bench sign-in failed: ${res.status} ${await res.text()}`);
  cookie = res.headers.getSetCookie().find((c) => c.startsWith('kinloop_session='))!.split(';')[0];
}

interface Answer {
  status: number | string;
  code: string;
}

async function upload(clientId: string, name: string, bytes: Uint8Array, extra: Record<string, string> = {}, fieldsAfterFile = false): Promise<Answer> {
  const form = new FormData();
  form.set('clientId', clientId);
  if (!fieldsAfterFile) for (const [k, v] of Object.entries(extra)) form.set(k, v);
  form.append('files', new Blob([bytes as BlobPart], { type: 'text/csv' }), name);
  if (fieldsAfterFile) for (const [k, v] of Object.entries(extra)) form.set(k, v);
  const res = await fetch(`${base}/api/uploads?wait=0`, { method: 'POST', headers: { cookie, origin: base, 'x-forwarded-for': address }, body: form });
  const body = await res.json();
  if (!res.ok) return { status: res.status, code: body.error?.code ?? '?' };
  // The answer is `queued`: follow the upload to its outcome.
  const id = body.files[0].uploadId as string;
  for (;;) {
    const row = await knex('uploads').where({ id }).first('status', 'error');
    if (row.status !== 'queued') return { status: res.status, code: row.status === 'rejected' || row.status === 'failed' ? `${row.status}: ${row.error.code}` : row.status };
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Sends a chunked body without end until the server answers; what was sent by then shows whether it stopped reading. */
function chunkedUntilAnswered(path: string, headers: Record<string, string>, head: Buffer, filler: Buffer, max: number): Promise<Answer & { sent: number }> {
  return new Promise((resolve) => {
    let sent = 0;
    let answered = false;
    const req = http.request(`${base}${path}`, { method: 'POST', headers: { ...headers, origin: base, 'x-forwarded-for': address, 'transfer-encoding': 'chunked' } });
    req.on('error', (err) => {
      if (!answered) resolve({ status: `connection error (${(err as NodeJS.ErrnoException).code})`, code: '—', sent });
    });
    req.on('response', (res) => {
      answered = true;
      const at = sent;
      let text = '';
      res.on('data', (d) => (text += d));
      res.on('end', () => {
        req.destroy();
        let code = '—';
        try {
          code = JSON.parse(text).error?.code ?? '—';
        } catch {
          code = '(not JSON)';
        }
        resolve({ status: res.statusCode!, code, sent: at });
      });
    });
    void (async () => {
      req.write(head);
      sent += head.length;
      while (!answered && sent < max && !req.destroyed) {
        const more = req.write(filler);
        sent += filler.length;
        if (!more) await new Promise((r) => (answered ? r(null) : req.once('drain', r)));
      }
      if (!answered && !req.destroyed) req.end();
    })();
  });
}

/** A multipart upload over a plain socket that stops after `bytes` of the file (after `holdMs`) and is cut. */
async function cutUpload(clientId: string, bytes: number, holdMs: number): Promise<Answer> {
  const port = Number(new URL(base).port);
  const boundary = '----benchcut';
  const head = `--${boundary}\r\nContent-Disposition: form-data; name="clientId"\r\n\r\n${clientId}\r\n--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="cut.csv"\r\nContent-Type: text/csv\r\n\r\ntime,power\n`;
  const socket = net.connect(port, '127.0.0.1');
  await new Promise((r) => socket.once('connect', r));
  socket.on('error', () => undefined);
  socket.write(`POST /api/uploads HTTP/1.1\r\nHost: 127.0.0.1:${port}\r\nCookie: ${cookie}\r\nOrigin: ${base}\r\nX-Forwarded-For: ${address}\r\nContent-Type: multipart/form-data; boundary=${boundary}\r\nContent-Length: ${head.length + bytes * 4}\r\n\r\n${head}`);
  const chunk = Buffer.from('1,20\n'.repeat(13_000));
  for (let sent = 0; sent < bytes; sent += chunk.length) if (!socket.write(chunk)) await new Promise((r) => socket.once('drain', r));
  await new Promise((r) => setTimeout(r, holdMs));
  socket.destroy();
  return { status: 'cut by the client', code: '—' };
}

// ---------------------------------------------------------------- files

const fill = (line: string, bytes: number, head = '') => head + line.repeat(Math.floor((bytes - head.length) / line.length));
const text = (s: string) => new TextEncoder().encode(s);

function validRide(targetBytes: number, startedAt: string): Uint8Array {
  const make = (rows: number) =>
    writeBenchCycleA(
      generateRide(
        {
          startedAt,
          warmupMin: 5,
          activeMin: rows / 600 - 10,
          cooldownMin: 5,
          meanPowerW: 24,
          cadenceRpm: 42,
          currents: { quadriceps_left: 80, quadriceps_right: 82, hamstrings_left: 60, hamstrings_right: 61, gluteals_left: 55, gluteals_right: 56 },
          pulseWidthUs: 300,
          frequencyHz: 35,
          hz: 10,
          deviceSerial: 'BENCH-HOSTILE',
        },
        11,
      ),
    );
  // Rows grow a little wider as the times grow: scale, then shrink until it fits.
  let rows = Math.floor((36_000 * targetBytes) / make(36_000).length);
  for (;;) {
    const bytes = make(rows);
    if (bytes.length <= targetBytes) return bytes;
    rows = Math.floor(rows * 0.98);
  }
}

async function objectCount(): Promise<number> {
  let count = 0;
  let token: string | undefined;
  do {
    const res = await s3().send(new ListObjectsV2Command({ Bucket: config().s3.bucket, Prefix: 'rides/', ContinuationToken: token }));
    count += res.KeyCount ?? 0;
    token = res.IsTruncated ? res.NextContinuationToken : undefined;
  } while (token);
  return count;
}

// ---------------------------------------------------------------- run

async function main() {
  const [clinic] = await knex('clinics').insert({ name: 'Bench clinic', time_zone: 'Europe/London' }).returning('id');
  const [user] = await knex('users').insert({ email: 'bench-carer@example.test', name: 'Bench Carer', password_hash: await hashPassword(PASSWORD) }).returning('id');
  const [client] = await knex('clients').insert({ clinic_id: clinic.id, display_name: 'Bench Rider', time_zone: 'Europe/London' }).returning('id');
  await knex('carer_links').insert({ carer_user_id: user.id, client_id: client.id, relationship: 'partner' });
  const profileColumns = Object.fromEntries(Array.from({ length: 60 }, (_, i) => [`Sensor ${i} reading`, { field: i === 0 ? 'time' : 'power' }]));
  const [profile] = await knex('import_profiles').insert({ clinic_id: clinic.id, name: '60 columns', mapping: JSON.stringify({ name: '60 columns', columns: profileColumns }) }).returning('id');
  await signIn('bench-carer@example.test');

  const boundary = '----bench';
  const multipartHead = (name: string) =>
    Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="clientId"\r\n\r\n${client.id}\r\n--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="${name}"\r\nContent-Type: text/csv\r\n\r\ntime,power\n`);

  // Every file is made before anything is measured: making them takes this process's CPU, which the health poller shares.
  const files = {
    valid: validRide(24 * MiB, '2026-10-05T09:30:00+02:00'),
    tiny: text(fill('0,1\n', 24.8e6, 'time,power\n')),
    commas: text(Array.from({ length: 999 }, () => ','.repeat(24 * 1024)).join('\n') + '\ntime,power\n0,1\n'),
    widePreamble: text(Array.from({ length: 1000 }, () => Array.from({ length: 199 }, (_, i) => `Sensor ${i} value`).join(',')).join('\n') + '\ntime,power\n0,1\n'),
    wideRows: text(fill(','.repeat(5000) + '\n', 24 * MiB, 'time,power\n')),
    lateField: validRide(MiB, '2026-10-06T09:30:00+02:00'),
    same: validRide(2 * MiB, '2026-10-07T09:30:00+02:00'),
  };
  const cases: [string, () => Promise<Answer & { sent?: number }>][] = [
    ['upload cut off after 6 MiB', () => cutUpload(client.id, 6 * MiB, 0)],
    ['slow upload held open 10 s, then closed', () => cutUpload(client.id, 256 * 1024, 10_000)],
    [`valid ride, ${(files.valid.length / MiB).toFixed(1)} MiB`, () => upload(client.id, 'valid.csv', files.valid)],
    ['6.2 million tiny rows "0,1", 24.8 MB', () => upload(client.id, 'tiny-rows.csv', files.tiny)],
    ['999-line preamble of 24 KB comma lines', () => upload(client.id, 'commas.csv', files.commas)],
    ['1,000 lines of 199 cells, 60-column import profile', () => upload(client.id, 'wide-preamble.csv', files.widePreamble, { importProfileId: profile.id })],
    ['24 MiB of 5,000-cell rows', () => upload(client.id, 'wide-rows.csv', files.wideRows)],
    ['chunked 300 MiB JSON to sign-in', () => chunkedUntilAnswered('/api/auth/sign-in', { 'content-type': 'application/json' }, Buffer.from('{"email":"x@example.test","password":"'), Buffer.alloc(64 * 1024, 'x'), 300 * MiB)],
    ['chunked 200 MB upload', () => chunkedUntilAnswered('/api/uploads', { 'content-type': `multipart/form-data; boundary=${boundary}`, cookie }, multipartHead('endless.csv'), Buffer.from('1,20\n'.repeat(13_000)), 200e6)],
    ['file, then a bad fallbackStartedAt', () => upload(client.id, 'late-field.csv', files.lateField, { fallbackStartedAt: 'not a date' }, true)],
    ['the same 2 MiB three times', async () => {
      const answers = [];
      for (let i = 0; i < 3; i++) answers.push(await upload(client.id, `same-${i}.csv`, files.same));
      return { status: 200, code: answers.map((a) => a.code).join(', ') };
    }],
  ];

  // Idle: the same poller with nothing else running.
  const idlePoll = pollHealth();
  await new Promise((r) => setTimeout(r, 8000));
  const idle = p99(await idlePoll.stop());

  const rows: string[][] = [];
  let worstRatio = 0;
  let worstParse = 0;
  for (const [name, run] of cases) {
    const objectsBefore = await objectCount();
    const appCpuBefore = await cpuSeconds(appPid);
    const memory = new MemoryWatch();
    await memory.start();
    const poll = pollHealth();
    const t0 = performance.now();
    const answer = await run();
    // Let the worker finish anything the case left (a cut upload's clean-up is in the app).
    const seconds = (performance.now() - t0) / 1000;
    const latencies = await poll.stop();
    const peaks = await memory.stop();
    const during = p99(latencies);
    worstRatio = Math.max(worstRatio, during / idle);
    worstParse = Math.max(worstParse, peaks.parse);
    rows.push([
      name,
      String(answer.status),
      answer.code,
      answer.sent !== undefined ? `${(answer.sent / MiB).toFixed(1)} MiB` : '',
      peaks.parse ? peaks.parse.toFixed(0) : '—',
      peaks.worker.toFixed(0),
      String((await objectCount()) - objectsBefore),
      seconds.toFixed(1),
      ((await cpuSeconds(appPid)) - appCpuBefore).toFixed(2),
      during.toFixed(0),
      (during / idle).toFixed(2) + '×',
    ]);
  }

  const header = ['case', 'HTTP', 'code / outcome', 'sent before answer', 'parse MiB', 'worker MiB', 'objects', 's', 'app CPU s', 'health p99 ms', 'ratio'];
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]) => cells.map((c, i) => (i === 0 || i === 2 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ');
  console.log(`\n/api/health p99 idle: ${idle.toFixed(0)} ms (same run, same poller)\n`);
  console.log(line(header));
  for (const r of rows) console.log(line(r));
  console.log(`\nworst parse-process peak: ${worstParse.toFixed(0)} MiB (target ≤ 400 MiB); worst health p99 ratio: ${worstRatio.toFixed(2)}× (target ≤ 3×)`);
}

main()
  .then(() => closeDatabase())
  .catch(async (err) => {
    console.error(err);
    await closeDatabase();
    process.exit(1);
  });
