// Serves the built app (Astro's standalone Node handler) and then makes one
// request so that the in-server worker starts right away, not on the first
// visitor's request. The handler runs inside a server of ours so that every
// answer, static files and the adapter's own redirects and errors included,
// carries the security headers (pages replace the CSP with their own).
import http from 'node:http';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { securityHeaders } from '../src/lib/http/security-headers.mjs';

const buildDir = path.resolve(process.env.KINLOOP_BUILD_DIR ?? 'dist');
const port = Number(process.env.PORT ?? 4321);
const host = process.env.HOST ?? '127.0.0.1';
const headers = Object.entries(securityHeaders({ https: (process.env.PUBLIC_URL ?? '').startsWith('https:') }));

process.env.ASTRO_NODE_AUTOSTART = 'disabled';
const { handler } = await import(pathToFileURL(path.join(buildDir, 'server', 'entry.mjs')).href);
const server = http.createServer((req, res) => {
  for (const [k, v] of headers) res.setHeader(k, v);
  handler(req, res);
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
