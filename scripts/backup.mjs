// `npm run backup -- FOLDER`: a consistent snapshot of the instance the usual
// settings describe (KINLOOP_DATA_DIR, KINLOOP_PG_PORT, KINLOOP_S3_PORT, or
// DATABASE_URL and S3_ENDPOINT for external ones): pg_dump of the database
// and a copy of every stored ride file with its SHA-256 (scripts/snapshot.ts).
// Works while Kinloop runs; services that are not running are started for
// the backup and stopped after it. FOLDER must be new or empty; relative to
// the project folder. --allow-missing-files: see scripts/snapshot.ts.
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, rmSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { startServices } from './lib/bench-stack.mjs';
import { appEnv, dataDirOf, resolveConfig } from './lib/config.mjs';
import { ensureDependencies, ensurePostgresInstalled, log, pgPaths, Supervisor } from './lib/services.mjs';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));
const [folderArg, ...flags] = process.argv.slice(2);
if (!folderArg || folderArg.startsWith('-')) {
  console.error('usage: npm run backup -- FOLDER [--allow-missing-files]');
  process.exit(64);
}
const folder = path.resolve(root, folderArg);
if (existsSync(folder) && readdirSync(folder).length) {
  log(`${folder} is not empty; a backup goes into a new or empty folder`);
  process.exit(1);
}
ensureDependencies(root);
const existed = existsSync(dataDirOf(process.env, root));
const config = resolveConfig(process.env, { root });
if (!config.external.db && !existsSync(path.join(pgPaths(config).data, 'PG_VERSION'))) {
  if (!existed) rmSync(config.dataDir, { recursive: true, force: true });
  log(`${config.dataDir} holds no Kinloop database; check KINLOOP_DATA_DIR`);
  process.exit(1);
}
const bin = ensurePostgresInstalled();
const supervisor = new Supervisor();
let code = 1;
try {
  await startServices(supervisor, bin, config, { pg: !config.external.db, s3: !config.external.s3, smtp: false });
  mkdirSync(folder, { recursive: true });
  const local = config.external.db ? [] : ['--socket', pgPaths(config).socket, '--port', String(config.pgPort)];
  const started = Date.now();
  log(`backing up ${config.external.db ? 'the database at DATABASE_URL' : config.dataDir} into ${folder}…`);
  const child = spawn(path.join(root, 'node_modules', '.bin', 'tsx'), ['scripts/snapshot.ts', 'backup', folder, '--pg-bin', bin, ...local, ...flags], { cwd: root, env: appEnv(config), stdio: 'inherit' });
  code = await new Promise((resolve) => child.on('exit', (c) => resolve(c ?? 1)));
  if (code === 0) log(`backup complete in ${((Date.now() - started) / 1000).toFixed(0)} s: ${folder}`);
  else {
    // Half a backup must never be mistaken for one.
    rmSync(folder, { recursive: true, force: true });
    log('the backup failed; the folder was removed');
  }
} catch (err) {
  rmSync(folder, { recursive: true, force: true });
  log(`the backup failed: ${err.message}`);
}
await supervisor.stopAll();
process.exit(code);
