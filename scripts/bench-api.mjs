// `npm run bench:api`: the cost of the read paths on the scale population
// against the demo, measured in one run with the requests interleaved, so
// that whatever else the machine is doing weighs on both alike.
//
// Two apps side by side, each with its own database, S3 stand-in, SMTP fake
// and data folder: the scale instance on the scale seed's settings
// (.data-scale, app on 4711, PostgreSQL 54711, S3 4811, SMTP 2711; the usual
// PORT, KINLOOP_PG_PORT, KINLOOP_S3_PORT, KINLOOP_SMTP_PORT, KINLOOP_DATA_DIR
// and KINLOOP_BUILD_DIR move them) and the demo instance one port higher on
// each, in the same folder name with `-demo` appended. An app already serving
// on those ports is reused; a scale folder not yet seeded is seeded first
// (`npm run seed:scale`). Both sign in as the demo admin, whose clinic holds
// the scale population's thousand clients in the scale database.
//
// Each round requests every target from the demo, the scale instance and
// the demo again (the control), in an order that rotates. A target stops
// after --min-rounds once its scale requests have used --budget-s seconds.
// Then the hourly jobs for both populations (bench-jobs.ts) and the page
// weight (as `npm run bench:pages`).
//   --rounds N (12)  --min-rounds N (3)  --budget-s S (60)  --timeout-s S (180)
//   --skip-jobs  --skip-pages
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { BenchSession } from './lib/bench-http.mjs';
import { benchSettings, configOf, demoTwinSettings, ensureFreshBuild, ensureInstance, folderOf, isServing } from './lib/bench-stack.mjs';
import { measurePages, printPages } from './lib/page-weight.mjs';
import { appEnv } from './lib/config.mjs';
import { ensureDependencies, ensurePostgresInstalled, log, Supervisor } from './lib/services.mjs';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));
const { values } = parseArgs({
  options: {
    rounds: { type: 'string', default: '12' },
    'min-rounds': { type: 'string', default: '3' },
    'budget-s': { type: 'string', default: '60' },
    'timeout-s': { type: 'string', default: '180' },
    'skip-jobs': { type: 'boolean', default: false },
    'skip-pages': { type: 'boolean', default: false },
  },
});
const ROUNDS = Number(values.rounds);
const MIN_ROUNDS = Number(values['min-rounds']);
const BUDGET_MS = Number(values['budget-s']) * 1000;
const TIMEOUT_MS = Number(values['timeout-s']) * 1000;
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
  const note = existsSync(scaleNote) ? JSON.parse(readFileSync(scaleNote, 'utf8')) : null;
  if (!scaleServing || !(await isServing(configOf(demoSettings, root)))) {
    const config = configOf(scaleSettings, root);
    await ensureFreshBuild(config, appEnv(config));
  }
  const demo = await ensureInstance(supervisor, bin, demoSettings, root, { seedDemo: true });
  const scale = await ensureInstance(supervisor, bin, scaleSettings, root, { seedDemo: false });
  const password = scale.config.demoPassword;
  const sessions = {
    demo: await new BenchSession(demo.config.port).signIn(ADMIN, password),
    scale: await new BenchSession(scale.config.port).signIn(ADMIN, password),
  };

  const [demoClient, scaleClient] = [await pickClient(sessions.demo), await pickClient(sessions.scale, scale.config.databaseUrl)];
  log(`client page: ${demoClient.name} (${demoClient.sessions} sessions) on the demo, ${scaleClient.name} (${scaleClient.sessions} sessions) on the scale data`);
  const targets = (c) => [
    { label: 'GET /api/triage', paths: ['/api/triage'] },
    { label: 'GET /api/caseload', paths: ['/api/caseload'] },
    { label: 'GET /api/clients', paths: ['/api/clients'] },
    { label: `client page data (${clientPageCalls(c.id).length} calls at once)`, paths: clientPageCalls(c.id), together: true },
    ...[...new Set(clientPageCalls(c.id))].map((p) => ({ label: `  GET ${p.replace(c.id, ':id')}`, paths: [p] })),
    { label: 'GET /api/sessions/:id (whole series)', paths: [`/api/sessions/${c.latestSession}`] },
    { label: 'page /triage', paths: ['/triage'] },
    { label: 'page /clients/:id', paths: [`/clients/${c.id}`] },
    { label: 'page /sessions/:id', paths: [`/sessions/${c.latestSession}`] },
  ];
  const plan = { demo: targets(demoClient), scale: targets(scaleClient) };
  const pids = { demo: demo.pid, scale: scale.pid };

  const cpus = os.cpus().length;
  log(`measuring on ${cpus} cores (load ${os.loadavg().map((l) => l.toFixed(1)).join(' ')}); ${ROUNDS} rounds at most, at least ${MIN_ROUNDS}, ${BUDGET_MS / 1000} s of scale time per target`);
  // One unmeasured request per target and instance: connection pools, JIT and caches warm.
  for (const i of plan.demo.keys()) for (const who of ['demo', 'scale']) await request(sessions[who], plan[who][i], pids[who]);

  const results = plan.demo.map((t) => ({ label: t.label, demo: [], scale: [], control: [], demoBytes: 0, scaleBytes: 0, demoWire: 0, scaleWire: 0, scaleRss: [], spent: 0, rounds: 0, timedOut: false }));
  const started = Date.now();
  for (let round = 0; round < ROUNDS; round++) {
    let active = 0;
    for (const [i, r] of results.entries()) {
      if (r.timedOut || (r.rounds >= MIN_ROUNDS && r.spent >= BUDGET_MS)) continue;
      active++;
      const order = rotate(['demo', 'scale', 'control'], round + i);
      for (const who of order) {
        const instance = who === 'control' ? 'demo' : who;
        const m = await request(sessions[instance], plan[instance][i], pids[instance]);
        if (m.timedOut) r.timedOut = true;
        r[who].push(m.ms);
        if (who === 'scale') {
          r.spent += m.ms;
          r.scaleBytes = m.bytes;
          r.scaleWire = m.wireBytes;
          if (m.peakRssMb) r.scaleRss.push({ before: m.rssBeforeMb, peak: m.peakRssMb });
        } else {
          r.demoBytes = m.bytes;
          r.demoWire = m.wireBytes;
        }
      }
      r.rounds++;
    }
    if (!active) break;
    log(`round ${round + 1} done (${((Date.now() - started) / 1000).toFixed(0)} s)`);
  }
  printRequests(results, { note, demoClient, scaleClient, seconds: (Date.now() - started) / 1000 });
  // The raw figures, for comparing runs later.
  const saved = path.join(scale.config.dataDir, `bench-api-${new Date().toISOString().replace(/[:.]/g, '-')}.json`);
  writeFileSync(saved, JSON.stringify({ at: new Date().toISOString(), note, demoClient, scaleClient, results }, null, 1) + '\n');
  log(`raw figures in ${saved}`);

  if (!values['skip-jobs']) {
    log('the hourly jobs over each whole population (one process each, in a transaction that is rolled back)…');
    const jobs = [];
    for (const job of ['sweep', 'mail']) jobs.push({ job, demo: await runJob(job, demo.env), scale: await runJob(job, scale.env) });
    printJobs(jobs);
  }
  if (!values['skip-pages']) printPages(await measurePages(demo.config, sessions.demo, password, BenchSession));
}

/**
 * The GETs the client page's islands make for a staff member, as the browser
 * sends them: ClientOverview (prescription, adherence), FlagHistory,
 * ClientCharts (trends, adherence), SessionsTable, Prescription, Pauses,
 * Notes; a GET two islands ask for at once goes once (src/components/api.ts).
 */
function clientPageCalls(id) {
  const c = `/api/clients/${id}`;
  return [`${c}/prescription`, `${c}/adherence?weeks=12`, `${c}/flags`, `${c}/trends?weeks=26`, `${c}/sessions?limit=50`, `${c}/pauses`, `${c}/notes`];
}

/** The demo's first rider, or on the scale data the active client with the longest history. */
async function pickClient(session, databaseUrl) {
  const { clients, total } = await session.json('/api/clients?q=Jonah%20Pryce');
  const id = total > 0 && clients[0].name === 'Jonah Pryce' && !(await isScale(session)) ? clients[0].id : await longestHistory(databaseUrl);
  const c = await session.json(`/api/clients/${id}`);
  const { sessions } = await session.json(`/api/clients/${id}/sessions?limit=1`);
  return { id, name: c.name, latestSession: sessions[0]?.id, sessions: await countSessions(session, id) };
}

/** The scale data holds a thousand clients or more; the demo ten. */
async function isScale(session) {
  return (await session.json('/api/clients?limit=1')).total >= 100;
}

/** The active client of the largest clinic with the most sessions: the heaviest client page. */
async function longestHistory(databaseUrl) {
  const { default: pg } = await import('pg');
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    const { rows } = await client.query(`
      SELECT r.client_id AS id FROM rides r JOIN clients c ON c.id = r.client_id
      WHERE c.archived_at IS NULL AND c.clinic_id = (SELECT clinic_id FROM clients GROUP BY clinic_id ORDER BY count(*) DESC LIMIT 1)
      GROUP BY r.client_id ORDER BY count(*) DESC LIMIT 1`);
    return rows[0]?.id;
  } finally {
    await client.end();
  }
}

async function countSessions(session, id) {
  let n = 0;
  let before = null;
  do {
    const page = await session.json(`/api/clients/${id}/sessions?limit=200${before ? `&before=${encodeURIComponent(before)}` : ''}`);
    n += page.sessions.length;
    before = page.nextBefore;
  } while (before);
  return n;
}

function rotate(list, by) {
  const k = by % list.length;
  return [...list.slice(k), ...list.slice(0, k)];
}

/** Times one target (its calls at once when `together`), with the server's peak memory when this run started it. */
async function request(session, target, pid) {
  const rssBeforeMb = pid ? resetPeakRss(pid) : null;
  const started = performance.now();
  const calls = target.together ? await Promise.all(target.paths.map((p) => session.time(p, TIMEOUT_MS))) : [await session.time(target.paths[0], TIMEOUT_MS)];
  const ms = performance.now() - started;
  const failed = calls.find((c) => !c.timedOut && c.status !== 200);
  if (failed) throw new Error(`${target.label} answered ${failed.status} on ${session.origin}`);
  return { ms, bytes: calls.reduce((s, c) => s + c.bytes, 0), wireBytes: calls.reduce((s, c) => s + c.wireBytes, 0), timedOut: calls.some((c) => c.timedOut), rssBeforeMb, peakRssMb: pid ? memoryMb(pid, 'VmHWM') : null };
}

// Linux keeps a process's peak resident memory (VmHWM); writing 5 to
// clear_refs resets it to the current resident memory (VmRSS), so each
// request's peak can be read on its own. Returns the memory before the request.
function resetPeakRss(pid) {
  try {
    writeFileSync(`/proc/${pid}/clear_refs`, '5');
    return memoryMb(pid, 'VmRSS');
  } catch {
    return null; // not Linux, or not allowed: no memory figure
  }
}
function memoryMb(pid, field) {
  try {
    const m = new RegExp(`${field}:\\s+(\\d+) kB`).exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Math.round(Number(m[1]) / 1024) : null;
  } catch {
    return null;
  }
}

function quantile(values, q) {
  const s = [...values].sort((a, b) => a - b);
  // Nearest rank: with fewer than 20 samples the p95 is the slowest one.
  return s[Math.min(s.length - 1, Math.ceil(q * s.length) - 1)];
}

const fmtMs = (ms) => (ms >= 10_000 ? `${(ms / 1000).toFixed(1)} s` : `${ms.toFixed(ms < 10 ? 1 : 0)} ms`);
const fmtKb = (b) => (b >= 1e6 ? `${(b / 1e6).toFixed(1)} MB` : b >= 1e3 ? `${(b / 1e3).toFixed(b < 1e4 ? 1 : 0)} kB` : `${b} B`);
const ratio = (a, b) => `${(a / b).toFixed(a / b >= 10 ? 0 : 2)}×`;

function printRequests(results, { note, demoClient, scaleClient, seconds }) {
  const lines = [
    '',
    `API and pages, scale ÷ demo (${seconds.toFixed(0)} s of requests, medians and p95 by nearest rank)`,
    note ? `scale data: seeded ${note.seededAt} with ${JSON.stringify(note.options)}: ${note.result.clients} clients, ${note.result.sessions.toLocaleString('en')} sessions, ${note.result.flags} flags` : 'scale data: an instance that was already running',
    `client page: demo ${demoClient.name} (${demoClient.sessions} sessions), scale ${scaleClient.name} (${scaleClient.sessions} sessions)`,
    '',
  ];
  const head = ['target', 'n', 'demo median', 'demo p95', 'scale median', 'scale p95', 'median ×', 'p95 ×', 'control ×', 'demo body (wire)', 'scale body (wire)', 'scale server memory'];
  const rows = results.map((r) => {
    const d50 = quantile(r.demo, 0.5);
    const s50 = quantile(r.scale, 0.5);
    const d95 = quantile(r.demo, 0.95);
    const s95 = quantile(r.scale, 0.95);
    return [
      r.label,
      String(r.rounds),
      fmtMs(d50),
      fmtMs(d95),
      `${r.timedOut ? '≥ ' : ''}${fmtMs(s50)}`,
      `${r.timedOut ? '≥ ' : ''}${fmtMs(s95)}`,
      ratio(s50, d50),
      ratio(s95, d95),
      ratio(quantile(r.control, 0.5), d50),
      `${fmtKb(r.demoBytes)} (${fmtKb(r.demoWire)})`,
      `${fmtKb(r.scaleBytes)} (${fmtKb(r.scaleWire)})`,
      r.scaleRss.length ? `${quantile(r.scaleRss.map((x) => x.peak - x.before), 0.5)} MB (to ${Math.max(...r.scaleRss.map((x) => x.peak))})` : '–',
    ];
  });
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((row) => row[i].length)));
  const line = (cells) => cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ');
  lines.push(line(head), ...rows.map(line), '', 'control × = the demo measured a second time, interleaved, ÷ the demo: how far two runs of the same thing differ now.', 'body = the answer as decompressed; wire = as sent, compressed as for a browser (br).', 'scale server memory = how far the scale server\'s resident memory rose during the request (median), and the highest peak, when this run started the server.');
  console.log(lines.join('\n'));
}

function runJob(job, env) {
  return new Promise((resolve, reject) => {
    const child = spawn(path.join(root, 'node_modules', '.bin', 'tsx'), ['scripts/bench-jobs.ts', job], { cwd: root, env, stdio: ['ignore', 'pipe', 'inherit'] });
    let out = '';
    child.stdout.on('data', (d) => (out += d));
    child.on('exit', (code) => {
      const line = out.trim().split('\n').pop();
      if (code !== 0 || !line?.startsWith('{')) reject(new Error(`bench-jobs ${job} failed (${code}): ${out}`));
      else resolve(JSON.parse(line));
    });
  });
}

function printJobs(jobs) {
  const label = { sweep: 'flag evaluation of every client (what the hourly sweep schedules at midnight)', mail: 'scheduled mail at 20:30 (digests, reminders, weekly summaries)' };
  const lines = ['', 'Hourly jobs over the whole population, serial, in a process of their own'];
  for (const { job, demo, scale } of jobs) {
    lines.push(
      `${label[job]}:`,
      `  demo  ${String(demo.clients).padStart(5)} clients  ${fmtMs(demo.ms).padStart(9)}  peak RSS ${demo.peakRssMb} MB (idle ${demo.rssBeforeMb} MB)  ${detail(demo)}`,
      `  scale ${String(scale.clients).padStart(5)} clients  ${fmtMs(scale.ms).padStart(9)}  peak RSS ${scale.peakRssMb} MB (idle ${scale.rssBeforeMb} MB)  ${detail(scale)}`,
      `  scale ÷ demo ${ratio(scale.ms, demo.ms)}; ${((100 * scale.ms) / 86_400_000).toFixed(3)} % of a day`,
    );
  }
  console.log(lines.join('\n'));
}

function detail(r) {
  return r.job === 'sweep' ? `${r.changes} flag changes` : `${r.digests} digests, ${r.reminders} reminders, ${r.weekly} weekly summaries`;
}

// Last, so that every declaration above is initialised before it runs.
await main().then(
  () => finish(0),
  (err) => {
    log(`bench:api failed: ${err.stack ?? err.message}`);
    return finish(1);
  },
);
