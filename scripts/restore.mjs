// `npm run restore -- FOLDER`: brings a backup made by `npm run backup` into
// an empty data folder (KINLOOP_DATA_DIR, default .data, with the usual port
// settings): checks every file of the backup against its SHA-256 before
// touching anything, creates the local PostgreSQL cluster, restores the dump
// into it as the cluster's superuser, stores the files in the S3 stand-in
// (or S3_ENDPOINT), then reads everything back and compares it with the
// backup's row counts and SHA-256 list. On failure the new data folder is
// removed again. Start Kinloop afterwards with the same settings (`npm start`).
import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { createReadStream, existsSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { startServices } from './lib/bench-stack.mjs';
import { appEnv, dataDirOf, resolveConfig } from './lib/config.mjs';
import { ensureDependencies, ensurePostgresInstalled, log, pgPaths, stopStaleCluster, Supervisor } from './lib/services.mjs';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));
const folderArg = process.argv[2];
if (!folderArg || folderArg.startsWith('-')) {
  console.error('usage: npm run restore -- FOLDER');
  process.exit(64);
}
const folder = path.resolve(root, folderArg);

function sha256Of(file) {
  return new Promise((resolve, reject) => {
    const hash = createHash('sha256');
    createReadStream(file).on('data', (d) => hash.update(d)).on('end', () => resolve(hash.digest('hex'))).on('error', reject);
  });
}

/** Every file the backup lists, with the SHA-256 it lists; the names of those that differ or are gone. */
async function damagedFiles() {
  const bad = [];
  for (const line of readFileSync(path.join(folder, 'files.sha256'), 'utf8').split('\n').filter(Boolean)) {
    const [sha, name] = [line.slice(0, 64), line.slice(66)];
    const file = path.join(folder, name);
    if (!existsSync(file)) bad.push(`${name} (missing)`);
    else if ((await sha256Of(file)) !== sha) bad.push(`${name} (changed)`);
  }
  return bad;
}

for (const required of ['manifest.json', 'database.dump', 'files.sha256']) {
  if (!existsSync(path.join(folder, required))) {
    log(`${folder} is not a complete Kinloop backup: ${required} is missing`);
    process.exit(1);
  }
}
const manifest = JSON.parse(readFileSync(path.join(folder, 'manifest.json'), 'utf8'));
log(`checking the backup of ${manifest.createdAt} (${manifest.files.length} files)…`);
const bad = await damagedFiles();
if (bad.length) {
  log(`the backup is damaged, nothing was restored: ${bad.length} file(s) do not match files.sha256, e.g. ${bad.slice(0, 5).join(', ')}`);
  process.exit(1);
}

const dataDir = dataDirOf(process.env, root);
if (existsSync(dataDir) && readdirSync(dataDir).length) {
  log(`${dataDir} is not empty; restore goes into an empty data folder. Set KINLOOP_DATA_DIR to a new folder.`);
  process.exit(1);
}
ensureDependencies(root);
const config = resolveConfig(process.env, { root });
if (config.external.db) {
  rmSync(config.dataDir, { recursive: true, force: true });
  log('DATABASE_URL is set: restore brings a backup into the local cluster only. For an external database, see "Backup and restore" in README.');
  process.exit(1);
}
const bin = ensurePostgresInstalled();
const supervisor = new Supervisor();
let code = 1;
try {
  await startServices(supervisor, bin, config, { s3: !config.external.s3, smtp: false });
  log(`restoring into ${config.dataDir}…`);
  const started = Date.now();
  const child = spawn(path.join(root, 'node_modules', '.bin', 'tsx'), ['scripts/snapshot.ts', 'restore', folder, '--pg-bin', bin, '--socket', pgPaths(config).socket, '--port', String(config.pgPort)], { cwd: root, env: appEnv(config), stdio: 'inherit' });
  code = await new Promise((resolve) => child.on('exit', (c) => resolve(c ?? 1)));
  if (code === 0) log(`restored in ${((Date.now() - started) / 1000).toFixed(0)} s; start Kinloop with the same settings (npm start). Everyone signs in again: sign-in secrets are not part of a backup.`);
} catch (err) {
  log(`the restore failed: ${err.message}`);
}
await supervisor.stopAll();
if (code !== 0) {
  stopStaleCluster(bin, config);
  rmSync(config.dataDir, { recursive: true, force: true });
  log(`the restore failed; ${config.dataDir} was removed again${config.external.s3 ? ' (files already stored in S3_ENDPOINT stay there)' : ''}`);
}
process.exit(code);
