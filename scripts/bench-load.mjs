// `npm run bench:load`: the scale clinic's staff and carers at once. Each
// virtual user is one connection that goes round without pause, as one of:
// - a therapist of the clinic (signed in once; more users than therapists
//   share them round the ring): the triage page and its list, the caseload,
//   a search of the client list, then one of the clinic's clients' page with
//   the calls its islands make, and that client's latest session page;
// - a carer of one of the clinic's clients (found through the database as
//   the scale seed made them): the carer's home and its calls, the upload
//   page and its calls, a one-hour ride file sent as the browser sends it
//   (POST /api/uploads, which waits up to 8 s for the worker), then that
//   upload's state. Each file is a new ride (Kinloop Bench Cycle A layout
//   from the demo's ride generator) starting at a time the client has no ride.
// By default 50 users (a fifth of them carers) for 60 s. The baselines are
// measured in the same run: each route with one user alone on the same
// instance (a therapist alone, then a carer alone), and the demo instance
// (ten clients) with the same users as the control for what the machine
// does under load. Afterwards it waits (bounded) for the workers to read
// every file, then verifies every upload of the run: accepted, exactly one
// session, its stored object byte for byte what was sent (SHA-256); and
// that no request was answered with a 5xx. Exits 1 if any of that fails.
//
// The stacks are bench:api's (the scale instance on the scale seed's
// settings, the demo instance one port higher; see scripts/bench-api.mjs and
// DEVELOPERS.md, "Scale"): an app already serving is reused, a folder not yet
// seeded is seeded first; each instance gets a worker of this run (parsing
// is part of what an upload costs). Every run adds its rides to both folders.
//   --users 50 (concurrent users per level, e.g. 4,16,50)  --seconds 60 (per level and instance)
//   --carer-share 0.2 (carers among each level's users)  --baseline-seconds 20 (each user alone)
//   --clients 40 (client pages visited)  --max-requests 200000 (per level, instance and kind of user)
//   --settle-s 300 (longest wait for the workers before verifying)
import { spawn, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import autocannon from 'autocannon';
import { tsImport } from 'tsx/esm/api';
import { BenchSession } from './lib/bench-http.mjs';
import { benchSettings, configOf, demoTwinSettings, ensureFreshBuild, ensureInstance, folderOf, isServing } from './lib/bench-stack.mjs';
import { appEnv } from './lib/config.mjs';
import { startWorker } from './lib/app.mjs';
import { RouteLatency } from './lib/route-latency.mjs';
import { ensureDependencies, ensurePostgresInstalled, log, Supervisor } from './lib/services.mjs';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));
const { values } = parseArgs({
  options: {
    users: { type: 'string', default: '50' },
    seconds: { type: 'string', default: '60' },
    'carer-share': { type: 'string', default: '0.2' },
    'baseline-seconds': { type: 'string', default: '20' },
    clients: { type: 'string', default: '40' },
    'max-requests': { type: 'string', default: '200000' },
    'settle-s': { type: 'string', default: '300' },
  },
});
const LEVELS = values.users.split(',').map(Number);
const SECONDS = Number(values.seconds);
const BASELINE_SECONDS = Number(values['baseline-seconds']);
const CARER_SHARE = Number(values['carer-share']);
const CLIENTS = Number(values.clients);
const MAX_REQUESTS = Number(values['max-requests']);
const SETTLE_S = Number(values['settle-s']);
if (!LEVELS.length || LEVELS.some((n) => !Number.isInteger(n) || n < 1 || n > 200)) throw new Error('--users: whole numbers from 1 to 200, separated by commas');
if (!(SECONDS >= 1 && SECONDS <= 600) || !(BASELINE_SECONDS >= 1 && BASELINE_SECONDS <= 600)) throw new Error('--seconds, --baseline-seconds: from 1 to 600');
if (!(CARER_SHARE >= 0 && CARER_SHARE <= 1)) throw new Error('--carer-share: from 0 to 1');
if (!(Number.isInteger(MAX_REQUESTS) && MAX_REQUESTS >= 200)) throw new Error('--max-requests: a whole number, at least 200');
if (!(SETTLE_S >= 1 && SETTLE_S <= 3600)) throw new Error('--settle-s: from 1 to 3600');
const ADMIN = 'admin@kinloop.test';
const WARM_UP_SECONDS = Math.min(5, SECONDS);
/** A request unanswered this long counts as failed (autocannon reconnects). */
const TIMEOUT_S = 120;
/** A carer cannot send more than one file a second (each POST waits for its file to be read): files enough for that. */
const FILES_PER_CARER_SECOND = 1;
const RIDE_MINUTES = { warmupMin: 5, activeMin: 50, cooldownMin: 5 };

/** Carers at a level of `users`: the share, at least one once there are two users, never all of them. */
const carersAt = (users) => (users < 2 || CARER_SHARE === 0 ? 0 : Math.min(users - 1, Math.max(1, Math.round(users * CARER_SHARE))));

ensureDependencies(root);
const scaleSettings = benchSettings('scale', process.env);
const demoSettings = demoTwinSettings(scaleSettings);
const bin = ensurePostgresInstalled();
const supervisor = new Supervisor();
const scratch = mkdtempSync(path.join(os.tmpdir(), 'kinloop-bench-load-'));
const finish = async (code) => {
  await supervisor.stopAll();
  rmSync(scratch, { recursive: true, force: true });
  process.exit(code);
};
process.on('SIGINT', () => finish(130));
process.on('SIGTERM', () => finish(143));

async function main() {
  const scaleNote = path.join(folderOf(scaleSettings, root), 'scale-seed.json');
  const scaleServing = await isServing(configOf(scaleSettings, root));
  if (!existsSync(scaleNote) && !scaleServing) {
    log('the scale folder is not seeded yet: running npm run seed:scale (a few minutes)…');
    const seeded = spawnSync(process.execPath, ['scripts/seed-scale.mjs'], { cwd: root, stdio: 'inherit' });
    if (seeded.status !== 0) throw new Error('the scale seed failed');
  }
  if (!scaleServing || !(await isServing(configOf(demoSettings, root)))) {
    const config = configOf(scaleSettings, root);
    await ensureFreshBuild(config, appEnv(config));
  }
  const demo = await ensureInstance(supervisor, bin, demoSettings, root, { seedDemo: true });
  const scale = await ensureInstance(supervisor, bin, scaleSettings, root, { seedDemo: false });
  await startWorker(supervisor, demo.config, demo.env);
  await startWorker(supervisor, scale.config, scale.env);
  const password = scale.config.demoPassword;
  const topUsers = Math.max(...LEVELS);
  const topCarers = Math.max(...LEVELS.map(carersAt));
  const uploadSeconds = (CARER_SHARE > 0 ? WARM_UP_SECONDS + BASELINE_SECONDS : 0) + LEVELS.reduce((s, n) => s + carersAt(n) * SECONDS, 0);
  const files = Math.ceil(uploadSeconds * FILES_PER_CARER_SECOND);
  const instances = {
    demo: await workload('demo', demo, password, topUsers, topCarers, files),
    scale: await workload('scale', scale, password, topUsers, topCarers, files),
  };
  for (const who of ['demo', 'scale']) {
    const w = instances[who];
    log(`${who}: ${w.users} therapists, ${w.clients.length} client pages; ${w.pairs.length} carers with a client each, ${w.files} one-hour ride files ready (${(w.fileBytes / 1024 ** 2).toFixed(0)} MB)`);
  }

  // Every path once on each instance, unmeasured: pools, JIT and caches warm.
  for (const who of ['demo', 'scale']) await run(instances[who], 1, CARER_SHARE > 0 ? 1 : 0, WARM_UP_SECONDS);

  // The baselines: each kind of user alone on each instance.
  const alone = {};
  for (const who of ['demo', 'scale']) {
    log(`one therapist alone on the ${who} instance for ${BASELINE_SECONDS} s…`);
    const therapist = await run(instances[who], 1, 0, BASELINE_SECONDS);
    let carer = null;
    if (CARER_SHARE > 0) {
      log(`one carer alone on the ${who} instance for ${BASELINE_SECONDS} s…`);
      carer = await run(instances[who], 0, 1, BASELINE_SECONDS);
    }
    alone[who] = { ...therapist.routes, ...(carer?.routes ?? {}) };
  }

  const results = [];
  for (const users of LEVELS) {
    const carers = carersAt(users);
    const row = { users, carers };
    for (const who of ['demo', 'scale']) {
      log(`${users} user${users === 1 ? '' : 's'} (${carers} carer${carers === 1 ? '' : 's'}) on the ${who} instance for ${SECONDS} s…`);
      row[who] = await run(instances[who], users - carers, carers, SECONDS);
    }
    results.push(row);
  }

  log(`waiting (at most ${SETTLE_S} s) for the workers to read every file sent, then verifying…`);
  const verified = {};
  await Promise.all(['demo', 'scale'].map(async (who) => (verified[who] = await verifyUploads(instances[who]))));

  const file = path.join(folderOf(scaleSettings, root), `bench-load-${new Date().toISOString().replace(/[:.]/g, '-')}.json`);
  const serverErrors = Object.fromEntries(['demo', 'scale'].map((who) => [who, instances[who].serverErrors ?? []]));
  writeFileSync(
    file,
    JSON.stringify({ at: new Date().toISOString(), load: os.loadavg(), cores: os.cpus().length, levels: LEVELS, seconds: SECONDS, baselineSeconds: BASELINE_SECONDS, carerShare: CARER_SHARE, alone, results, verified, serverErrors }, null, 2),
  );
  const failed = print(results, alone, instances, verified);
  log(`raw figures: ${file}`);
  return failed ? 1 : 0;
}

const tsx = path.join(root, 'node_modules', '.bin', 'tsx');

/** Runs scripts/bench-load-data.ts against an instance's database and S3 stand-in. */
function dataTask(instance, command, input) {
  const inFile = path.join(scratch, `${command}-${instance.config.port}-in.json`);
  const outFile = path.join(scratch, `${command}-${instance.config.port}-out.json`);
  writeFileSync(inFile, JSON.stringify(input));
  const child = spawn(tsx, [path.join(root, 'scripts', 'bench-load-data.ts'), command, '--in', inFile, '--out', outFile], { cwd: root, env: instance.env, stdio: ['ignore', 'inherit', 'inherit'] });
  return new Promise((resolve, reject) => {
    child.on('exit', (code) => (code === 0 ? resolve(JSON.parse(readFileSync(outFile, 'utf8'))) : reject(new Error(`bench-load-data.ts ${command} failed (exit ${code})`))));
    child.on('error', reject);
  });
}

/**
 * What the users of an instance need: the clinic's therapists (one session
 * each, up to `users`), a few of its clients with their latest session, its
 * carers with a client each (up to `carers`) and the ride files they will
 * send, spread over those clients at start times each client has free.
 */
async function workload(name, instance, password, users, carers, files) {
  const { port } = instance.config;
  const admin = await new BenchSession(port).signIn(ADMIN, password);
  const staff = (await admin.json('/api/staff')).staff ?? [];
  const therapists = staff.filter((s) => s.role === 'therapist' && !s.disabled).slice(0, users);
  if (!therapists.length) throw new Error(`no therapist to sign in as on 127.0.0.1:${port}`);
  const cookies = [];
  for (const t of therapists) cookies.push((await new BenchSession(port).signIn(t.email, password)).cookie);
  const { clients: listed } = await admin.json(`/api/caseload?limit=${Math.min(200, CLIENTS * 4)}`);
  const clients = [];
  for (const c of listed.filter((_, i) => i % 4 === 0).slice(0, CLIENTS)) {
    const { sessions } = await admin.json(`/api/clients/${c.clientId}/sessions?limit=1`);
    clients.push({ id: c.clientId, session: sessions[0]?.id ?? null });
  }
  // Uploads of the run's clients from now on are the run's (the database's clock is this machine's).
  const since = new Date(Date.now() - 1000).toISOString();
  const base = { name, port, origin: `http://127.0.0.1:${port}`, env: instance.env, config: instance.config, cookies, clients, users: therapists.length, latency: new RouteLatency(), sent: [], since };
  if (!carers) return { ...base, pairs: [], files: 0, fileBytes: 0 };

  // A ride that finished half an hour ago at the latest; earlier ones every 67 minutes back.
  const before = new Date(Date.now() - 90 * 60_000).toISOString();
  const found = await dataTask(base, 'carers', { clinicOf: ADMIN, pairs: carers, slots: 1, before });
  if (!found.pairs.length) throw new Error(`no carer of an active client in ${ADMIN}'s clinic on 127.0.0.1:${port}`);
  const perClient = Math.ceil(files / found.pairs.length);
  const { pairs: slotted } = await dataTask(base, 'carers', { clinicOf: ADMIN, pairs: carers, slots: perClient, before });
  const sessions = new Map();
  const pairs = [];
  let fileBytes = 0;
  let made = 0;
  for (const [i, p] of slotted.entries()) {
    sessions.set(p.email, sessions.get(p.email) ?? (await new BenchSession(port).signIn(p.email, password)).cookie);
    const queue = [];
    for (const startedAt of p.startTimes) {
      const file = await rideUpload(p.clientId, startedAt, made++ + i * 100_000);
      fileBytes += file.bytes;
      queue.push(file);
    }
    pairs.push({ email: p.email, clientId: p.clientId, cookie: sessions.get(p.email), queue });
  }
  return { ...base, pairs, files: made, fileBytes };
}

const { generateRide } = await tsImport('../src/lib/demo/ride-generator.ts', import.meta.url);
const { RIDE_LAYOUTS } = await tsImport('../src/lib/demo/ride-layouts.ts', import.meta.url);

/**
 * One one-hour ride of a client as the cycle writes it, in the multipart
 * body the upload page sends (clientId first, the file's time of writing as
 * its fallback start, then the file).
 */
async function rideUpload(clientId, startedAt, seed) {
  const spec = {
    startedAt,
    ...RIDE_MINUTES,
    meanPowerW: 18 + (seed % 13),
    cadenceRpm: 40 + (seed % 7),
    currents: { quadriceps_left: 70, quadriceps_right: 72, hamstrings_left: 55, hamstrings_right: 56, gluteals_left: 50, gluteals_right: 51 },
    pulseWidthUs: 300,
    frequencyHz: 35,
    hz: 1,
    deviceSerial: 'KBA-LOAD',
  };
  const layout = RIDE_LAYOUTS.A;
  const bytes = layout.write(generateRide(spec, seed));
  const name = layout.fileName(spec);
  const form = new FormData();
  form.append('clientId', clientId);
  form.append('fallbackStartedAt', new Date(Date.parse(startedAt) + 60 * 60_000).toISOString());
  form.append('files', new Blob([bytes], { type: 'text/csv' }), name);
  const request = new Request('http://127.0.0.1/api/uploads', { method: 'POST', body: form });
  return {
    clientId,
    name,
    startedAt,
    sha256: createHash('sha256').update(bytes).digest('hex'),
    bytes: bytes.length,
    body: Buffer.from(await request.arrayBuffer()),
    contentType: request.headers.get('content-type'),
  };
}

/**
 * The requests of each kind of user, page by page, each labelled with its
 * route. Each connection is one user: it takes a session (and, for a carer, a
 * client) at the start of each round, round the ring.
 */
function rounds(instance) {
  let nextTherapist = 0;
  let nextCarer = 0;
  const { clients, cookies, pairs, latency } = instance;
  const headersOf = (context, extra = {}) => ({ cookie: context.cookie, 'accept-encoding': 'br, gzip', ...extra });
  const onResponse = (route) => (status, body, context) => {
    if (status >= 500) latency.serverError(route, context.path, status, body);
  };
  // `first` picks who the user is this round; `make` gives the URL (by default the route itself).
  const step = (route, { method = 'GET', first, make = () => route, body } = {}) => ({
    route,
    method,
    path: route,
    onResponse: onResponse(route),
    setupRequest: (req, context) => {
      if (first) first(context);
      const p = make(context);
      if (p === null) return null;
      context.path = p;
      if (!body) return { ...req, path: p, headers: headersOf(context) };
      const sent = body(context);
      if (!sent) return null;
      return { ...req, path: p, headers: headersOf(context, sent.headers), body: sent.body };
    },
  });

  const pickTherapist = (context) => {
    context.cookie = cookies[nextTherapist++ % cookies.length];
    context.client = clients[Math.floor(Math.random() * clients.length)];
  };
  const forClient = (route, suffix) => step(route, { make: (c) => `/api/clients/${c.client.id}${suffix}` });
  const therapist = [
    step('/triage', { first: pickTherapist }),
    step('/api/triage'),
    step('/api/caseload'),
    step('/api/clients?q=…', { make: () => '/api/clients?q=an' }),
    step('/clients/:id', { make: (c) => `/clients/${c.client.id}` }),
    forClient('/api/clients/:id/prescription', '/prescription'),
    forClient('/api/clients/:id/adherence', '/adherence?weeks=12'),
    forClient('/api/clients/:id/flags', '/flags'),
    forClient('/api/clients/:id/trends', '/trends?weeks=26'),
    forClient('/api/clients/:id/sessions', '/sessions?limit=50'),
    forClient('/api/clients/:id/pauses', '/pauses'),
    forClient('/api/clients/:id/notes', '/notes'),
    step('/sessions/:id', { make: (c) => (c.client.session ? `/sessions/${c.client.session}` : `/clients/${c.client.id}/sessions`) }),
  ];

  const pickCarer = (context) => {
    context.pair = pairs[nextCarer++ % pairs.length];
    context.cookie = context.pair.cookie;
  };
  // A pair whose files are all sent hands its place to the next one with files left.
  const nextFile = (context) => {
    for (let k = 0; k < pairs.length; k++) {
      const pair = pairs[(pairs.indexOf(context.pair) + k) % pairs.length];
      if (pair.queue.length) {
        context.pair = pair;
        context.cookie = pair.cookie;
        return pair.queue.shift();
      }
    }
    return null;
  };
  const carer = [
    step('/carer', { first: pickCarer }),
    step('/api/clients?linked=1', { make: () => '/api/clients?linked=1&limit=200' }),
    step('/api/clients/:id/week', { make: (c) => `/api/clients/${c.pair.clientId}/week` }),
    step('/upload', { make: (c) => `/upload?clientId=${c.pair.clientId}` }),
    step('/api/clients?limit=200', { make: () => '/api/clients?limit=200' }),
    step('/api/import-profiles'),
    {
      ...step('POST /api/uploads', {
        method: 'POST',
        make: () => '/api/uploads',
        body: (context) => {
          const file = nextFile(context);
          // No file left: the round starts again without an upload.
          if (!file) return null;
          const record = { clientId: file.clientId, name: file.name, startedAt: file.startedAt, sha256: file.sha256, bytes: file.bytes };
          instance.sent.push(record);
          context.record = record;
          return { headers: { 'content-type': file.contentType, origin: instance.origin }, body: file.body };
        },
      }),
      onResponse: (status, body, context) => {
        if (status >= 500) latency.serverError('POST /api/uploads', '/api/uploads', status, body);
        if (status !== 200 && status !== 202) return;
        try {
          const answer = JSON.parse(body).files?.[0];
          if (answer?.uploadId) context.record.uploadId = context.uploadId = answer.uploadId;
        } catch {
          // An answer that is not JSON leaves the upload unnamed: the verification finds it by its file.
        }
      },
    },
    step('/api/uploads/:id', { make: (c) => (c.uploadId ? `/api/uploads/${c.uploadId}` : null) }),
  ];
  return { therapist, carer };
}

/** One stretch of load: `therapists` and `carers` connections side by side for `seconds`. */
async function run(instance, therapists, carers, seconds) {
  instance.latency = new RouteLatency();
  const started = performance.now();
  const { therapist, carer } = rounds(instance);
  const kinds = [
    [therapists, therapist],
    [carers, carer],
  ].filter(([n]) => n > 0);
  const results = await Promise.all(
    kinds.map(([connections, requests]) => {
      const tracker = autocannon({
        url: instance.origin,
        connections,
        duration: seconds,
        maxOverallRequests: MAX_REQUESTS,
        timeout: TIMEOUT_S,
        requests,
      });
      // One request in flight per connection: the iterator's current request is the one just answered.
      tracker.on('response', (client, status, _bytes, ms) => instance.latency.record(client.requestIterator.currentRequest.route, status, ms));
      return tracker;
    }),
  );
  const duration = Math.max(...results.map((r) => r.duration), (performance.now() - started) / 1000);
  const routes = instance.latency.summary(duration);
  const serverErrors = instance.latency.serverErrors;
  instance.serverErrors = [...(instance.serverErrors ?? []), ...serverErrors];
  const total = Object.values(routes).reduce((n, r) => n + r.n, 0);
  return {
    duration,
    requests: total,
    perSecond: total / duration,
    uploads: routes['POST /api/uploads']?.n ?? 0,
    errors: results.reduce((n, r) => n + r.errors, 0),
    timeouts: results.reduce((n, r) => n + r.timeouts, 0),
    non2xx: Object.values(routes).reduce((n, r) => n + r.non2xx, 0),
    serverErrors: serverErrors.length,
    routes,
  };
}

async function verifyUploads(instance) {
  if (!instance.sent.length) return { uploads: 0, verified: 0, unanswered: 0, stillQueued: 0, waitedMs: 0, objects: 0, orphans: 0, problems: [], sent: 0, answered: 0 };
  const result = await dataTask(instance, 'verify', { sent: instance.sent, since: instance.since, waitSeconds: SETTLE_S });
  return { ...result, sent: instance.sent.length, answered: instance.sent.filter((s) => s.uploadId).length };
}

const ms = (v) => (v == null ? '–' : v >= 1000 ? `${(v / 1000).toFixed(1)} s` : `${Math.round(v)} ms`);
const ratio = (a, b) => (a && b ? `${(a / b).toFixed(2)}×` : '–');

function table(head, rows) {
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((row) => row[i].length)));
  const line = (cells) => cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ');
  return [line(head), ...rows.map(line)];
}

/** Prints the figures and the verification; returns whether anything failed. */
function print(results, alone, instances, verified) {
  const lines = [
    '',
    `bench:load — ${os.cpus().length} cores, load ${os.loadavg().map((l) => l.toFixed(1)).join(' ')}; ${SECONDS} s per level and instance, each user alone ${BASELINE_SECONDS} s`,
    `therapists: ${instances.scale.users} of the scale clinic (${instances.demo.users} on the demo), round of 13 requests over ${instances.scale.clients.length} clients;`,
    `carers: ${instances.scale.pairs.length} with a client each (${instances.demo.pairs.length} on the demo), round of 8 requests with one one-hour ride file (${Math.round(instances.scale.fileBytes / Math.max(1, instances.scale.files) / 1000)} kB)`,
    '',
    ...table(
      ['users (carers)', 'scale req/s', 'uploads/s', 'errors', 'non-2xx', '5xx', 'demo req/s', 'demo uploads/s', 'demo 5xx'],
      results.map((r) => [
        `${r.users} (${r.carers})`,
        r.scale.perSecond.toFixed(1),
        (r.scale.uploads / r.scale.duration).toFixed(2),
        String(r.scale.errors),
        String(r.scale.non2xx),
        String(r.scale.serverErrors),
        r.demo.perSecond.toFixed(1),
        (r.demo.uploads / r.demo.duration).toFixed(2),
        String(r.demo.serverErrors),
      ]),
    ),
  ];
  for (const r of results) {
    lines.push('', `${r.users} users (${r.users - r.carers} therapists, ${r.carers} carers), scale instance, per route:`);
    const routes = Object.keys(r.scale.routes);
    lines.push(
      ...table(
        ['route', 'n', 'req/s', 'p50', 'p95', 'p99', 'max', 'p50 ÷ alone', 'p99 ÷ alone', 'demo p50', 'scale ÷ demo p50', 'non-2xx'],
        routes.map((route) => {
          const s = r.scale.routes[route];
          const a = alone.scale[route];
          const d = r.demo.routes[route];
          return [route, String(s.n), s.perSecond.toFixed(1), ms(s.p50), ms(s.p95), ms(s.p99), ms(s.max), ratio(s.p50, a?.p50), ratio(s.p99, a?.p99), ms(d?.p50), ratio(s.p50, d?.p50), String(s.non2xx)];
        }),
      ),
    );
  }
  lines.push('', 'each user alone, scale instance (the baseline):');
  lines.push(
    ...table(
      ['route', 'n', 'p50', 'p95', 'p99'],
      Object.entries(alone.scale).map(([route, a]) => [route, String(a.n), ms(a.p50), ms(a.p95), ms(a.p99)]),
    ),
  );

  let failed = false;
  lines.push('', 'verification:');
  for (const who of ['demo', 'scale']) {
    const v = verified[who];
    const errors = instances[who].serverErrors ?? [];
    lines.push(
      `  ${who}: ${v.sent} files sent, ${v.answered} answered with an upload, ${v.uploads} stored (${v.unanswered} of them without an answer: the run ended or the request timed out); ${v.verified} verified (accepted, one session, object identical by SHA-256); ${v.stillQueued} still queued after ${(v.waitedMs / 1000).toFixed(0)} s; ${v.objects} objects stored, ${v.orphans} of them without an upload; ${errors.length} 5xx answers`,
    );
    for (const p of v.problems.slice(0, 20)) lines.push(`    upload ${p.uploadId ?? '–'} (${p.name}): ${p.problem}`);
    if (v.problems.length > 20) lines.push(`    … and ${v.problems.length - 20} more`);
    const grouped = new Map();
    for (const e of errors) {
      const key = `${e.status} ${e.route}: ${e.detail}`;
      grouped.set(key, { ...e, count: (grouped.get(key)?.count ?? 0) + 1 });
    }
    for (const [key, e] of grouped) lines.push(`    ${e.count} × ${key} (e.g. ${e.path})`);
    if (v.problems.length || v.stillQueued || errors.length || v.verified !== v.uploads) failed = true;
  }
  lines.push(
    '',
    '÷ alone = the same route with one user alone on the same instance, this run (a therapist for theirs, a carer for theirs). scale ÷ demo = the scale population against ten clients with the same users.',
    'POST /api/uploads includes the server waiting up to 8 s for the worker to read the file, as the upload page does.',
    failed ? 'VERIFICATION FAILED' : 'verification passed: every stored upload accepted with one session and an identical object, no object left without its upload, no 5xx',
  );
  console.log(lines.join('\n'));
  return failed;
}

main()
  .then((code) => finish(code))
  .catch(async (err) => {
    console.error(err);
    await finish(1);
  });
