// `npm run bench:hostile`: the stack `npm start` runs (app, worker with its
// parse processes, PostgreSQL, S3 stand-in, SMTP fake) on a data folder and
// ports of its own, then scripts/bench-hostile.ts replays hostile requests
// and files against it and prints, per case, the answer, the parse
// processes' and the worker's peak memory, and /api/health's p99 latency
// during the case against its idle p99 in the same run.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { appEnv, resolveConfig } from './lib/config.mjs';
import { buildApp, dbTasks, startApp, startWorker } from './lib/app.mjs';
import { ensureDependencies, ensurePostgresInstalled, log, startPostgres, startS3, startSmtp, stopStaleCluster, Supervisor, wipe } from './lib/services.mjs';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));
const DEFAULTS = {
  PORT: '4471',
  KINLOOP_DATA_DIR: '.data-bench-hostile',
  KINLOOP_PG_PORT: '54471',
  KINLOOP_S3_PORT: '4671',
  KINLOOP_SMTP_PORT: '2671',
  KINLOOP_BUILD_DIR: 'dist-bench',
};

const supervisor = new Supervisor();
async function finish(code) {
  await supervisor.stopAll();
  process.exit(code);
}
process.on('SIGINT', () => finish(130));
process.on('SIGTERM', () => finish(143));

try {
  ensureDependencies(root);
  const pick = (env) => Object.fromEntries(Object.keys(DEFAULTS).filter((k) => env[k]).map((k) => [k, env[k]]));
  const first = resolveConfig(pick(process.env), { root, defaults: DEFAULTS });
  const pgBin = ensurePostgresInstalled();
  stopStaleCluster(pgBin, first);
  wipe(first.dataDir);
  const config = resolveConfig(pick(process.env), { root, defaults: DEFAULTS });
  const env = appEnv(config, { NODE_ENV: 'production', KINLOOP_TRUST_PROXY: '1' });
  const build = buildApp(config, env);
  build.catch(() => {});
  supervisor.onStop(startPostgres(pgBin, config));
  await startS3(supervisor, config);
  await startSmtp(supervisor, config);
  dbTasks(config, env, ['migrate']);
  await build;
  const [app, worker] = await Promise.all([startApp(supervisor, config, env), startWorker(supervisor, config, env)]);
  log('running the hostile cases…');
  const cases = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'scripts', 'bench-hostile.ts'), ...process.argv.slice(2)], {
    cwd: root,
    env: { ...env, KINLOOP_BASE_URL: `http://127.0.0.1:${config.port}`, BENCH_WORKER_PID: String(worker.pid), BENCH_APP_PID: String(app.pid) },
    stdio: 'inherit',
  });
  const code = await new Promise((resolve) => cases.on('exit', (c) => resolve(c ?? 1)));
  await finish(code);
} catch (err) {
  log(`the benchmark could not run: ${err.message}`);
  await finish(1);
}
