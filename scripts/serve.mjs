// Serves the built app (Astro's standalone Node server) and then makes one
// request so that the in-server worker starts right away, not on the first
// visitor's request.
import path from 'node:path';
import { pathToFileURL } from 'node:url';

const buildDir = path.resolve(process.env.KINLOOP_BUILD_DIR ?? 'dist');
await import(pathToFileURL(path.join(buildDir, 'server', 'entry.mjs')).href);

const url = `http://127.0.0.1:${process.env.PORT ?? 4321}/api/health`;
for (let i = 0; i < 100; i++) {
  try {
    await fetch(url);
    console.log('kinloop app ready');
    break;
  } catch {
    await new Promise((r) => setTimeout(r, 100));
  }
}
