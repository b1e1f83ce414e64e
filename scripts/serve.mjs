// Serves the built app (Astro's standalone Node server) and says so once it
// answers. Background work runs in the worker process (`npm run worker`),
// never here.
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { appConfig } from './lib/config.mjs';

const { buildDir, port } = appConfig(process.env);

// A failure inside one request must never end the server. Every stream of a
// request handles its own errors; this is the net under them: a socket error
// that escaped (a client gone mid-request) is logged and the server goes on.
// Anything else is a bug whose state is unknown: the process exits and the
// supervisor (`npm start`) starts a fresh one.
const SOCKET_ERRORS = new Set(['ECONNRESET', 'EPIPE', 'ECONNABORTED', 'ERR_STREAM_PREMATURE_CLOSE', 'ERR_STREAM_DESTROYED']);
process.on('uncaughtException', (err) => {
  if (SOCKET_ERRORS.has(err?.code) || err?.message === 'aborted') {
    console.error(`kinloop app: uncaught error of a request's connection (${err.code ?? err.message}); the server goes on`);
    return;
  }
  console.error('kinloop app: uncaught exception, exiting:', err);
  process.exit(1);
});

await import(pathToFileURL(path.join(buildDir, 'server', 'entry.mjs')).href);

const url = `http://127.0.0.1:${port}/api/health`;
for (let i = 0; i < 100; i++) {
  try {
    await fetch(url);
    console.log('kinloop app ready');
    break;
  } catch {
    await new Promise((r) => setTimeout(r, 100));
  }
}
