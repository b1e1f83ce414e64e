// Serves the built app (Astro's standalone Node handler) and says so once it
// answers. Background work runs in the worker process (`npm run worker`),
// never here. The handler runs inside a server of ours so that every answer,
// static files and the adapter's own redirects and errors included, carries
// the security headers (pages replace the CSP with their own) and text is
// compressed for clients that accept it.
import http from 'node:http';
import compression from 'compression';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { securityHeaders } from '../src/lib/http/security-headers.mjs';
import { appConfig } from './lib/config.mjs';

const { buildDir, port, host, https } = appConfig(process.env);
const headers = Object.entries(securityHeaders({ https }));

// Brotli (quality 4, the package's default for answers made on the fly) or
// gzip for text answers of 1 kB and more: pages, JSON, scripts, CSS, CSV. A
// 200-client page of triage (196 kB of JSON) goes out as 37 kB in 3.7 ms
// (brotli) or 41 kB in 4.3 ms (gzip level 4; level 6 saves 5 % more for a
// quarter more CPU), measured on this machine; on a clinic's or a rider's
// home connection the bytes are most of the wait.
const compress = compression({ threshold: 1024, level: 4 });

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

process.env.ASTRO_NODE_AUTOSTART = 'disabled';
const { handler } = await import(pathToFileURL(path.join(buildDir, 'server', 'entry.mjs')).href);
const server = http.createServer((req, res) => {
  for (const [k, v] of headers) res.setHeader(k, v);
  compress(req, res, () => handler(req, res));
});
await new Promise((resolve, reject) => server.once('error', reject).listen(port, host, resolve));

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
