// `npm run seed:scale -- --clients 1000 --years 2`: a database of its own
// (default folder .data-scale, PostgreSQL on 54711, S3 stand-in on 4811; the
// usual KINLOOP_DATA_DIR, KINLOOP_PG_PORT, KINLOOP_S3_PORT… move it) holding
// the demo plus an invented regional service: about 300,000 sessions with
// prescriptions, pauses, checks and flags, sample series for some sessions.
// A seeded folder is reused as it is; --fresh wipes it and seeds again.
//   --clients N        clients of the main clinic (1000)
//   --years Y          length of the period (2)
//   --other-clinics N  further clinics with a twentieth of the clients each (2)
//   --series-every N   every N-th session, and each client's latest, gets its samples (200)
//   --store-files      also store those sessions' ride files in the S3 stand-in
//   --no-demo          leave out the demo scenario (the main clinic is then a new one)
//   --seed N           another invented population (1)
import { spawn } from 'node:child_process';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { appEnv } from './lib/config.mjs';
import { dbTasks } from './lib/app.mjs';
import { benchSettings, configOf, folderOf, markBenchFolder, startServices, wipeBenchFolder } from './lib/bench-stack.mjs';
import { ensureDependencies, ensurePostgresInstalled, log, stopStaleCluster, Supervisor } from './lib/services.mjs';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));
const NOTE = 'scale-seed.json';

const { values } = parseArgs({
  options: {
    clients: { type: 'string' },
    years: { type: 'string' },
    'other-clinics': { type: 'string' },
    'series-every': { type: 'string' },
    seed: { type: 'string' },
    'store-files': { type: 'boolean' },
    'no-demo': { type: 'boolean' },
    fresh: { type: 'boolean' },
  },
});
const passOn = Object.entries(values).flatMap(([k, v]) => (k === 'fresh' || k === 'no-demo' ? [] : v === true ? [`--${k}`] : [`--${k}`, v]));

ensureDependencies(root);
const settings = benchSettings('scale', process.env);
const dir = folderOf(settings, root);
const bin = ensurePostgresInstalled();
if (existsSync(path.join(dir, NOTE)) && !values.fresh) {
  const note = JSON.parse(readFileSync(path.join(dir, NOTE), 'utf8'));
  log(`${dir} was seeded on ${note.seededAt} (${JSON.stringify(note.options)}): reusing it; --fresh seeds it again`);
  process.exit(0);
}
if (existsSync(dir) && readdirSync(dir).length && !values.fresh) {
  log(`${dir} holds an unfinished seed or other data; run again with --fresh to wipe it and start over`);
  process.exit(1);
}
stopStaleCluster(bin, { dataDir: dir });
wipeBenchFolder(dir, root, 'scale');
const config = configOf(settings, root);
markBenchFolder(config.dataDir);

const supervisor = new Supervisor();
const stop = async (code) => {
  await supervisor.stopAll();
  process.exit(code);
};
process.on('SIGINT', () => stop(130));
process.on('SIGTERM', () => stop(143));
try {
  const demo = !values['no-demo'];
  await startServices(supervisor, bin, config, { s3: demo || Boolean(values['store-files']), smtp: false });
  const env = appEnv(config, { NODE_ENV: 'production' });
  const started = Date.now();
  dbTasks(config, env, demo ? ['migrate', 'seed'] : ['migrate']);
  log(`seeding the population into ${config.dataDir}…`);
  const child = spawn(path.join(root, 'node_modules', '.bin', 'tsx'), ['scripts/seed-scale.ts', ...passOn, '--password', config.demoPassword], { cwd: root, env, stdio: 'inherit' });
  const code = await new Promise((resolve) => child.on('exit', (c) => resolve(c ?? 1)));
  if (code === 0) log(`seeded in ${((Date.now() - started) / 1000).toFixed(0)} s`);
  await stop(code);
} catch (err) {
  log(`the scale seed failed: ${err.message}`);
  await stop(1);
}
