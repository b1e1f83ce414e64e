// `npm run bench:load`: many staff at once on the scale population. Each
// virtual user is a therapist of the scale clinic (signed in once, each with
// their own session) who goes round a morning's work without pause: the
// triage page and its list, the caseload, a search of the client list, then
// one of the clinic's clients' page with the calls its islands make, and
// that client's latest session page. The baseline is one user alone on the
// same instance, measured in the same run; the demo instance (ten clients)
// at each concurrency is the control for what the machine does under load.
//
// The stacks are bench:api's (the scale instance on the scale seed's
// settings, the demo instance one port higher; see scripts/bench-api.mjs and
// DEVELOPERS.md, "Scale"): an app already serving is reused, a folder not yet
// seeded is seeded first. Levels run one after another, the demo before the
// scale instance at each, after a warm-up of every path.
//   --users 1,4,16 (concurrent users; the first is the baseline)
//   --seconds 20 (per level and instance)  --clients 40 (client pages visited)
import { spawnSync } from 'node:child_process';
import { existsSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import autocannon from 'autocannon';
import { BenchSession } from './lib/bench-http.mjs';
import { benchSettings, configOf, demoTwinSettings, ensureFreshBuild, ensureInstance, folderOf, isServing } from './lib/bench-stack.mjs';
import { appEnv } from './lib/config.mjs';
import { ensureDependencies, ensurePostgresInstalled, log, Supervisor } from './lib/services.mjs';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));
const { values } = parseArgs({
  options: {
    users: { type: 'string', default: '1,4,16' },
    seconds: { type: 'string', default: '20' },
    clients: { type: 'string', default: '40' },
  },
});
const LEVELS = values.users.split(',').map(Number);
const SECONDS = Number(values.seconds);
const CLIENTS = Number(values.clients);
if (!LEVELS.length || LEVELS.some((n) => !Number.isInteger(n) || n < 1 || n > 200)) throw new Error('--users: whole numbers from 1 to 200, separated by commas');
if (!(SECONDS >= 1 && SECONDS <= 600)) throw new Error('--seconds: from 1 to 600');
const ADMIN = 'admin@kinloop.test';

ensureDependencies(root);
const scaleSettings = benchSettings('scale', process.env);
const demoSettings = demoTwinSettings(scaleSettings);
const bin = ensurePostgresInstalled();
const supervisor = new Supervisor();
const finish = async (code) => {
  await supervisor.stopAll();
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
  const password = scale.config.demoPassword;
  const top = Math.max(...LEVELS);
  const instances = {
    demo: await workload(demo.config.port, password, top),
    scale: await workload(scale.config.port, password, top),
  };
  log(`users: ${instances.scale.users} therapists on the scale data, ${instances.demo.users} on the demo; ${instances.scale.clients.length} client pages on the scale data`);

  // Every path once on each instance, unmeasured: pools, JIT and caches warm.
  for (const who of ['demo', 'scale']) await run(instances[who], 1, Math.min(5, SECONDS), true);

  const results = [];
  for (const users of LEVELS) {
    const row = { users };
    for (const who of ['demo', 'scale']) {
      log(`${users} user${users === 1 ? '' : 's'} on the ${who} instance for ${SECONDS} s…`);
      row[who] = await run(instances[who], users, SECONDS);
    }
    results.push(row);
  }
  const file = path.join(folderOf(scaleSettings, root), `bench-load-${new Date().toISOString().replace(/[:.]/g, '-')}.json`);
  writeFileSync(file, JSON.stringify({ at: new Date().toISOString(), load: os.loadavg(), levels: LEVELS, seconds: SECONDS, results }, null, 2));
  print(results, instances);
  log(`raw figures: ${file}`);
}

/**
 * The therapists of the clinic the admin belongs to (one session each, up to
 * `users`; fewer therapists than users share them round the ring), a few of
 * the clinic's clients with their latest session, and the round each user
 * walks.
 */
async function workload(port, password, users) {
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
  return { port, cookies, clients, users: therapists.length };
}

/**
 * One user's round: what a therapist's morning asks of the server, page by
 * page. Each connection is one user: it takes a session of its own on its
 * first request, and a client at random at the start of each round.
 */
function round(instance) {
  let next = 0;
  const { clients, cookies } = instance;
  const as = (context, req, p) => {
    context.cookie ??= cookies[next++ % cookies.length];
    return { ...req, path: p ?? req.path, headers: { ...req.headers, cookie: context.cookie, 'accept-encoding': 'br, gzip' } };
  };
  const get = (p) => ({ method: 'GET', path: p, setupRequest: (req, context) => as(context, req) });
  const forClient = (make) => ({ method: 'GET', path: '/', setupRequest: (req, context) => as(context, req, make(context.client)) });
  const c = (suffix) => forClient((x) => `/api/clients/${x.id}${suffix}`);
  return [
    {
      method: 'GET',
      path: '/triage',
      setupRequest: (req, context) => {
        context.client = clients[Math.floor(Math.random() * clients.length)];
        return as(context, req);
      },
    },
    get('/api/triage'),
    get('/api/caseload'),
    get('/api/clients?q=an'),
    forClient((x) => `/clients/${x.id}`),
    c('/prescription'),
    c('/adherence?weeks=12'),
    c('/flags'),
    c('/trends?weeks=26'),
    c('/sessions?limit=50'),
    c('/pauses'),
    c('/notes'),
    forClient((x) => (x.session ? `/sessions/${x.session}` : `/clients/${x.id}/sessions`)),
  ];
}

async function run(instance, users, seconds, warmUp = false) {
  const requests = round(instance);
  const result = await autocannon({
    url: `http://127.0.0.1:${instance.port}`,
    connections: users,
    duration: seconds,
    timeout: 120,
    requests,
  });
  if (warmUp) return null;
  return {
    requests: result.requests.total,
    perSecond: result.requests.total / result.duration,
    rounds: result.requests.total / requests.length,
    p50: result.latency.p50,
    p90: result.latency.p90,
    p99: result.latency.p99,
    max: result.latency.max,
    errors: result.errors + result.timeouts,
    non2xx: result.non2xx,
  };
}

const ms = (v) => (v >= 1000 ? `${(v / 1000).toFixed(1)} s` : `${Math.round(v)} ms`);
const ratio = (a, b) => (a && b ? `${(a / b).toFixed(2)}×` : '–');

function print(results, instances) {
  const base = results[0].scale;
  const head = ['users', 'scale req/s', 'scale p50', 'scale p90', 'scale p99', 'p50 ÷ 1 user', 'p99 ÷ 1 user', 'req/s ÷ 1 user', 'demo req/s', 'demo p50', 'scale ÷ demo p50', 'errors (scale, demo)'];
  const rows = results.map((r) => [
    String(r.users),
    r.scale.perSecond.toFixed(1),
    ms(r.scale.p50),
    ms(r.scale.p90),
    ms(r.scale.p99),
    ratio(r.scale.p50, base.p50),
    ratio(r.scale.p99, base.p99),
    ratio(r.scale.perSecond, base.perSecond),
    r.demo.perSecond.toFixed(1),
    ms(r.demo.p50),
    ratio(r.scale.p50, r.demo.p50),
    `${r.scale.errors + r.scale.non2xx}, ${r.demo.errors + r.demo.non2xx}`,
  ]);
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((row) => row[i].length)));
  const line = (cells) => cells.map((c, i) => c.padStart(widths[i])).join('  ');
  console.log(
    [
      '',
      `bench:load — ${instances.scale.users} therapists, ${instances.scale.clients.length} client pages, ${SECONDS} s per level, ${os.cpus().length} cores, load ${os.loadavg()[0].toFixed(1)}`,
      `a round: /triage, /api/triage, /api/caseload, /api/clients?q=an, a client page and its 7 calls, its latest session page (${round(instances.scale).length} requests)`,
      '',
      line(head),
      ...rows.map(line),
      '',
      '÷ 1 user = the same instance with one user, this run (the baseline). scale ÷ demo = the scale population against ten clients at the same number of users.',
      'errors = failed, timed-out or non-2xx answers; any is a finding.',
    ].join('\n'),
  );
}

main()
  .then(() => finish(0))
  .catch(async (err) => {
    console.error(err);
    await finish(1);
  });
