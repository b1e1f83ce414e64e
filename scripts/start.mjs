// `npm start`: everything Kinloop needs on this machine, from a fresh clone.
// Installs what is missing, starts PostgreSQL, the S3 stand-in and the SMTP
// fake (unless DATABASE_URL, S3_ENDPOINT or SMTP_URL point elsewhere), runs the
// migrations, seeds the demo, builds and serves the app. Ctrl-C stops it all.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { appEnv, resolveConfig } from './lib/config.mjs';
import { buildApp, dbTasks, startApp, startWorker } from './lib/app.mjs';
import { ensureDependencies, ensurePostgresInstalled, log, startPostgres, startS3, startSmtp, Supervisor } from './lib/services.mjs';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));
const supervisor = new Supervisor();
let stopping = false;
async function shutdown(code) {
  if (stopping) return;
  stopping = true;
  log('stopping…');
  await supervisor.stopAll();
  log('stopped; nothing of Kinloop is left running.');
  process.exit(code);
}
process.on('SIGINT', () => shutdown(0));
process.on('SIGTERM', () => shutdown(0));

try {
  ensureDependencies(root);
  const config = resolveConfig(process.env, { root });
  const env = appEnv(config);
  const build = buildApp(config, env);
  build.catch(() => {});
  if (!config.external.db) supervisor.onStop(startPostgres(ensurePostgresInstalled(), config));
  if (!config.external.s3) await startS3(supervisor, config);
  if (!config.external.smtp) await startSmtp(supervisor, config);
  dbTasks(config, env, ['migrate', 'seed']);
  await build;
  await Promise.all([startApp(supervisor, config, env), startWorker(supervisor, config, env)]);
  const DEMO_SIGN_INS = JSON.parse(readFileSync(path.join(root, 'src', 'lib', 'demo', 'sign-ins.json'), 'utf8'));
  const width = Math.max(...DEMO_SIGN_INS.map((s) => s.email.length));
  process.stdout.write(
    [
      '',
      `  Kinloop is running at ${config.publicUrl}`,
      '',
      `  Demo sign-ins (password: ${config.demoPassword}):`,
      ...DEMO_SIGN_INS.map((s) => `    ${s.email.padEnd(width)}  ${s.role}`),
      '',
      `  Data folder: ${config.dataDir}${config.mailboxDir ? `   Captured e-mail: ${config.publicUrl}/admin/mailbox` : ''}`,
      '  Press Ctrl-C to stop.',
      '',
    ].join('\n') + '\n',
  );
} catch (err) {
  log(`could not start: ${err.message}`);
  await shutdown(1);
}
