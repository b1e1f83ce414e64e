// Runs a benchmark script against a PostgreSQL cluster of its own (its own
// folder and port, fsync on, so disk figures are real), then stops it.
//   node scripts/bench.mjs scripts/bench-ingest.ts
// KINLOOP_DATA_DIR and KINLOOP_PG_PORT move it (defaults: .data-bench, 54701,
// clear of `npm start` and of every test slot; see scripts/lib/bench-stack.mjs).
import { spawn } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { appEnv } from './lib/config.mjs';
import { benchSettings, configOf, folderOf, markBenchFolder, wipeBenchFolder } from './lib/bench-stack.mjs';
import { ensureDependencies, ensurePostgresInstalled, log, startPostgres, stopStaleCluster } from './lib/services.mjs';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));
const script = process.argv[2];
if (!script) {
  console.error('usage: node scripts/bench.mjs <script.ts>');
  process.exit(64);
}
ensureDependencies(root);
const settings = benchSettings('ingest', process.env);
const bin = ensurePostgresInstalled();
const dir = folderOf(settings, root);
stopStaleCluster(bin, { dataDir: dir });
wipeBenchFolder(dir, root, 'ingest');
const config = configOf(settings, root);
markBenchFolder(config.dataDir);
const stop = startPostgres(bin, config);
let code = 1;
try {
  const env = appEnv(config);
  const { dbTasks } = await import('./lib/app.mjs');
  dbTasks(config, env, ['migrate']);
  log(`running ${script}…`);
  const child = spawn(path.join(root, 'node_modules', '.bin', 'tsx'), [script, ...process.argv.slice(3)], { cwd: root, env, stdio: 'inherit' });
  code = await new Promise((resolve) => child.on('exit', (c) => resolve(c ?? 1)));
} finally {
  stop();
}
process.exit(code);
