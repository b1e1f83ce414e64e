// Building and running the app and its database tasks, shared by start and test.
import { spawn } from 'node:child_process';
import { openSync } from 'node:fs';
import path from 'node:path';
import { log, run } from './services.mjs';

const bin = (root, name) => path.join(root, 'node_modules', '.bin', name);

/** Builds into config.buildDir in the background; output goes to a log file in the data folder. */
export function buildApp(config, env) {
  const logFile = path.join(config.dataDir, 'build.log');
  const out = openSync(logFile, 'w');
  log('building the app…');
  const child = spawn(bin(config.root, 'astro'), ['build'], { cwd: config.root, env, stdio: ['ignore', out, out] });
  return new Promise((resolve, reject) => {
    child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`the build failed (exit ${code}); see ${logFile}`))));
    child.on('error', reject);
  });
}

/** Runs scripts/db.ts tasks; only these get the owner role's URL (migrations), never the app server. */
export function dbTasks(config, env, tasks) {
  const withOwner = config.databaseOwnerUrl ? { ...env, DATABASE_OWNER_URL: config.databaseOwnerUrl } : env;
  run(bin(config.root, 'tsx'), [path.join(config.root, 'scripts', 'db.ts'), ...tasks], { cwd: config.root, env: withOwner });
}

export function startApp(supervisor, config, env) {
  log(`starting the app on ${config.publicUrl}…`);
  return supervisor.start('app', process.execPath, [path.join(config.root, 'scripts', 'serve.mjs')], {
    cwd: config.root,
    env,
    ready: /kinloop app ready/,
  });
}
