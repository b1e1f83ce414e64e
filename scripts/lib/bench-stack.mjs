// Stacks of their own for the benchmarks, the scale seed and the backup drill:
// a PostgreSQL cluster, the S3 stand-in, the SMTP fake and the app, per data
// folder. The default ports stay away from `npm start` (4321, 54329, 4568,
// 2525) and from every test slot: slot N (0…9) uses 4391, 54339, 4578 and
// 2535 plus 10·N, and processes its tests start take up to 9 above those, so
// slots cover 4391–4490, 54339–54438, 4578–4677 and 2535–2634.
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { appEnv, portAndFolderSettings, resolveConfig } from './config.mjs';
import { buildApp, dbTasks, startApp } from './app.mjs';
import { log, pgPaths, startPostgres, startS3, startSmtp, stopStaleCluster, wipe } from './services.mjs';

export const BENCH_DEFAULTS = {
  // bench:ingest: a cluster only (no S3 or mail: the ingest bench calls the parser and the database).
  ingest: { KINLOOP_DATA_DIR: '.data-bench', KINLOOP_PG_PORT: '54701', S3_ENDPOINT: 'http://127.0.0.1:1', SMTP_URL: 'smtp://127.0.0.1:1' },
  // seed:scale and the scale instance of bench:api; bench:api's demo instance takes each port + 1.
  scale: { PORT: '4711', KINLOOP_DATA_DIR: '.data-scale', KINLOOP_PG_PORT: '54711', KINLOOP_S3_PORT: '4811', KINLOOP_SMTP_PORT: '2711', KINLOOP_BUILD_DIR: 'dist-bench' },
};

/** Written into a folder a benchmark created, so that a later run may wipe it and nothing else. */
const MARK = '.kinloop-bench';

/** The raw settings of a bench stack: the caller's ports and folders over the bench's defaults. */
export function benchSettings(kind, env) {
  return { ...BENCH_DEFAULTS[kind], ...portAndFolderSettings(env) };
}

/** The demo instance beside a scale stack: every port one higher, the folder with `-demo` appended. */
export function demoTwinSettings(settings) {
  const up = (key) => String(Number(settings[key]) + 1);
  return {
    ...settings,
    PORT: up('PORT'),
    KINLOOP_PG_PORT: up('KINLOOP_PG_PORT'),
    KINLOOP_S3_PORT: up('KINLOOP_S3_PORT'),
    KINLOOP_SMTP_PORT: up('KINLOOP_SMTP_PORT'),
    KINLOOP_DATA_DIR: `${settings.KINLOOP_DATA_DIR}-demo`,
  };
}

export function configOf(settings, root) {
  return resolveConfig({}, { root, defaults: settings });
}

export function folderOf(settings, root) {
  return path.resolve(root, settings.KINLOOP_DATA_DIR);
}

const isEmptyDir = (dir) => !existsSync(dir) || readdirSync(dir).length === 0;

/**
 * Empties a bench folder before a fresh run. Refuses a folder that holds
 * anything a bench did not create: a mistyped KINLOOP_DATA_DIR must never
 * wipe someone's data.
 */
export function wipeBenchFolder(dir, root, kind) {
  // Folders made before the mark existed are recognised by the bench's own default name.
  const isDefault = dir === path.resolve(root, BENCH_DEFAULTS[kind].KINLOOP_DATA_DIR);
  if (!isEmptyDir(dir) && !existsSync(path.join(dir, MARK)) && !isDefault) {
    throw new Error(`${dir} holds data that no benchmark created; choose another KINLOOP_DATA_DIR (or empty it yourself)`);
  }
  wipe(dir);
}

/** Marks a folder as a bench folder (after resolveConfig has created it). */
export function markBenchFolder(dir) {
  writeFileSync(path.join(dir, MARK), 'Created by a Kinloop benchmark or the scale seed; `npm run seed:scale -- --fresh` may wipe it.\n');
}

/** Whether a Kinloop app already answers on the config's port. */
export async function isServing(config) {
  try {
    const res = await fetch(`http://127.0.0.1:${config.port}/api/health`, { signal: AbortSignal.timeout(3000) });
    const body = await res.json().catch(() => null);
    return Boolean(body && 'db' in body);
  } catch {
    return false;
  }
}

/** Whether the folder's own cluster is running (a `npm start` of the same folder, for example). */
export function clusterRunning(bin, config) {
  const { data } = pgPaths(config);
  if (!existsSync(path.join(data, 'PG_VERSION'))) return false;
  const asOwner = typeof process.getuid === 'function' && process.getuid() === 0 ? ['runuser', ['-u', 'postgres', '--', path.join(bin, 'pg_ctl'), 'status', '-D', data]] : [path.join(bin, 'pg_ctl'), ['status', '-D', data]];
  return spawnSync(asOwner[0], asOwner[1], { stdio: 'ignore' }).status === 0;
}

/**
 * Starts what a folder's stack needs and is not running yet; registers each
 * stop with the supervisor, so that only what this run started is stopped.
 */
export async function startServices(supervisor, bin, config, { pg = true, s3 = true, smtp = true } = {}) {
  if (pg && !clusterRunning(bin, config)) {
    stopStaleCluster(bin, config);
    supervisor.onStop(startPostgres(bin, config));
  }
  if (s3 && !(await answers(config.s3Port))) await startS3(supervisor, config);
  if (smtp && !(await answers(config.smtpPort, 'smtp'))) await startSmtp(supervisor, config);
}

async function answers(port, kind = 'http') {
  if (kind === 'http') {
    try {
      await fetch(`http://127.0.0.1:${port}/`, { signal: AbortSignal.timeout(2000) });
      return true;
    } catch {
      return false;
    }
  }
  const net = await import('node:net');
  return new Promise((resolve) => {
    const socket = net.connect(port, '127.0.0.1');
    socket.once('connect', () => {
      socket.destroy();
      resolve(true);
    });
    socket.once('error', () => resolve(false));
  });
}

function newestMtime(target) {
  if (!existsSync(target)) return 0;
  const st = statSync(target);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = st.mtimeMs;
  for (const entry of readdirSync(target)) newest = Math.max(newest, newestMtime(path.join(target, entry)));
  return newest;
}

/**
 * Builds into the config's build folder unless a build newer than every
 * source file is there already: a benchmark must never measure yesterday's code.
 */
export async function ensureFreshBuild(config, env) {
  const entry = path.join(config.buildDir, 'server', 'entry.mjs');
  const built = existsSync(entry) ? statSync(entry).mtimeMs : 0;
  const sources = Math.max(...['src', 'public', 'astro.config.mjs', 'package-lock.json', 'tsconfig.json'].map((p) => newestMtime(path.join(config.root, p))));
  if (built > sources) {
    log(`reusing the build in ${config.buildDir} (newer than every source file)`);
    return;
  }
  const started = Date.now();
  await buildApp(config, env);
  log(`built in ${((Date.now() - started) / 1000).toFixed(0)} s`);
}

/**
 * A running app on the settings' folder and ports: the one already serving
 * there, or one this run starts (services, migrations, the demo seed when
 * asked, then the app without its background worker, so that no job runs
 * inside the measured server). `pid` is set only for an app this run started.
 */
export async function ensureInstance(supervisor, bin, settings, root, { seedDemo }) {
  const config = configOf(settings, root);
  const env = appEnv(config, { NODE_ENV: 'production', KINLOOP_WORKER: 'off' });
  if (await isServing(config)) {
    log(`reusing the app already serving on 127.0.0.1:${config.port} (${config.dataDir})`);
    return { config, env, pid: null };
  }
  markBenchFolder(config.dataDir);
  await startServices(supervisor, bin, config);
  dbTasks(config, env, seedDemo ? ['migrate', 'seed'] : ['migrate']);
  const child = await startApp(supervisor, config, env);
  return { config, env, pid: child.pid };
}
