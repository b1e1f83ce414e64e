// Runs a benchmark script against a PostgreSQL cluster of its own (its own
// folder and port, fsync on, so disk figures are real), then stops it.
//   node scripts/bench.mjs scripts/bench-ingest.ts
import { spawn } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { appEnv, resolveConfig } from './lib/config.mjs';
import { ensureDependencies, ensurePostgresInstalled, log, startPostgres, stopStaleCluster, wipe } from './lib/services.mjs';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));
const script = process.argv[2];
if (!script) {
  console.error('usage: node scripts/bench.mjs <script.ts>');
  process.exit(64);
}
ensureDependencies(root);
const defaults = { KINLOOP_DATA_DIR: '.data-bench', KINLOOP_PG_PORT: '54349', S3_ENDPOINT: 'http://127.0.0.1:1', SMTP_URL: 'smtp://127.0.0.1:1' };
const bin = ensurePostgresInstalled();
stopStaleCluster(bin, resolveConfig({}, { root, defaults }));
wipe(path.join(root, '.data-bench'));
const config = resolveConfig({}, { root, defaults });
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
