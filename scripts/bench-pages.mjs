// `npm run bench:pages`: the gzip JavaScript each of /triage, /clients/:id,
// /sessions/:id, /my-week and /upload loads, read from the build output by
// following each page's scripts, module preloads and islands through their
// static imports. Uses the demo instance of `npm run bench:api` (reused when
// it is serving, else started and stopped again; same port and folder settings).
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { BenchSession } from './lib/bench-http.mjs';
import { benchSettings, configOf, demoTwinSettings, ensureFreshBuild, ensureInstance, isServing } from './lib/bench-stack.mjs';
import { appEnv } from './lib/config.mjs';
import { measurePages, printPages } from './lib/page-weight.mjs';
import { ensureDependencies, ensurePostgresInstalled, log, Supervisor } from './lib/services.mjs';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));
ensureDependencies(root);
const settings = demoTwinSettings(benchSettings('scale', process.env));
const supervisor = new Supervisor();
let code = 0;
try {
  const config = configOf(settings, root);
  if (!(await isServing(config))) await ensureFreshBuild(config, appEnv(config));
  const demo = await ensureInstance(supervisor, ensurePostgresInstalled(), settings, root, { seedDemo: true });
  const staff = await new BenchSession(demo.config.port).signIn('admin@kinloop.test', demo.config.demoPassword);
  printPages(await measurePages(demo.config, staff, demo.config.demoPassword, BenchSession));
} catch (err) {
  log(`bench:pages failed: ${err.stack ?? err.message}`);
  code = 1;
}
await supervisor.stopAll();
process.exit(code);
