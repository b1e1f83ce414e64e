// `npm test`: the same set-up as `npm start`, for a throwaway stack of its own
// (own data folder, ports, database and bucket), then every test: unit,
// integration against the real services, and browser tests in Chromium.
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { appEnv, resolveConfig } from './lib/config.mjs';
import { buildApp, dbTasks, startApp, startWorker } from './lib/app.mjs';
import {
  aptInstall,
  ensureChromiumInstalled,
  ensureDependencies,
  ensurePostgresInstalled,
  log,
  startPostgres,
  startS3,
  startSmtp,
  stopStaleCluster,
  Supervisor,
  wipe,
} from './lib/services.mjs';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));
// Fixed test ports, away from `npm start`'s, so both can run at once.
// KINLOOP_TEST_SLOT=N shifts ports and folders so that several test runs can share a machine.
const slot = Number(process.env.KINLOOP_TEST_SLOT ?? 0);
const suffix = slot ? `-${slot}` : '';
const TEST_DEFAULTS = {
  PORT: String(4391 + slot * 10),
  KINLOOP_DATA_DIR: `.data-test${suffix}`,
  KINLOOP_PG_PORT: String(54339 + slot * 10),
  KINLOOP_S3_PORT: String(4578 + slot * 10),
  KINLOOP_SMTP_PORT: String(2535 + slot * 10),
  KINLOOP_BUILD_DIR: `dist-test${suffix}`,
  KINLOOP_DEMO_PASSWORD: 'kinloop-demo-2026',
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
  // The user's own settings (PORT, DATABASE_URL, …) are for `npm start`; tests never touch them.
  const config = resolveConfig({}, { root, defaults: TEST_DEFAULTS });
  const pgBin = ensurePostgresInstalled();
  ensureChromiumInstalled();
  // pdftotext, pdfinfo and pdftoppm read the report PDFs back in the tests.
  if (!existsSync('/usr/bin/pdftotext')) aptInstall(['poppler-utils']);
  stopStaleCluster(pgBin, config);
  wipe(config.dataDir);
  const fresh = resolveConfig({}, { root, defaults: TEST_DEFAULTS });
  fresh.pgFsync = 'off';
  const env = appEnv(fresh, {
    NODE_ENV: 'production',
    KINLOOP_TRUST_PROXY: '1',
    KINLOOP_DB_POOL: '5',
    // Flags are judged a moment after the last file of a batch; tests need not wait the usual 10 s.
    KINLOOP_FLAG_DELAY_S: '1',
  });
  const build = buildApp(fresh, env);
  build.catch(() => {});
  supervisor.onStop(startPostgres(pgBin, fresh));
  await startS3(supervisor, fresh);
  await startSmtp(supervisor, fresh);
  dbTasks(fresh, env, ['migrate', 'seed']);
  await build;
  await Promise.all([startApp(supervisor, fresh, env), startWorker(supervisor, fresh, env)]);

  const testEnv = {
    ...env,
    KINLOOP_BASE_URL: `http://127.0.0.1:${fresh.port}`,
    KINLOOP_ROOT: root,
    KINLOOP_PG_BIN: pgBin,
    KINLOOP_PG_PORT: String(fresh.pgPort),
    KINLOOP_S3_PORT: String(fresh.s3Port),
    KINLOOP_SMTP_PORT: String(fresh.smtpPort),
  };
  const args = ['run', ...process.argv.slice(2)];
  log(`running the tests (vitest ${args.join(' ')})…`);
  const vitest = spawn(path.join(root, 'node_modules', '.bin', 'vitest'), args, { cwd: root, env: testEnv, stdio: 'inherit' });
  const code = await new Promise((resolve) => vitest.on('exit', (c, signal) => resolve(c ?? (signal ? 1 : 0))));
  await finish(code);
} catch (err) {
  log(`tests could not run: ${err.message}`);
  await finish(1);
}
