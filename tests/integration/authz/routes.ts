import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';

const API_DIR = path.resolve('src/pages/api');

/** Every API route and method, read from the files under src/pages/api, as "METHOD /api/path/[param]". */
export function discoverApiRoutes(dir = API_DIR): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const file = path.join(dir, name);
    if (statSync(file).isDirectory()) {
      out.push(...discoverApiRoutes(file));
      continue;
    }
    if (!/\.(ts|js)$/.test(name)) continue;
    const rel = path.relative(path.resolve('src/pages'), file).replace(/\\/g, '/').replace(/\.(ts|js)$/, '').replace(/\/index$/, '');
    const source = readFileSync(file, 'utf8');
    for (const m of source.matchAll(/export const (GET|POST|PUT|PATCH|DELETE)\b/g)) out.push(`${m[1]} /${rel}`);
  }
  return out.sort();
}

const PAGES_DIR = path.resolve('src/pages');

/** Every page a browser opens with GET, as "/path/[param]", read from src/pages outside the API. */
export function discoverPages(dir = PAGES_DIR): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const file = path.join(dir, name);
    if (statSync(file).isDirectory()) {
      if (file !== API_DIR) out.push(...discoverPages(file));
      continue;
    }
    const rel = '/' + path.relative(PAGES_DIR, file).replace(/\\/g, '/').replace(/\.(astro|ts|js)$/, '').replace(/(^|\/)index$/, '');
    if (name.endsWith('.astro') || /export const GET\b/.test(readFileSync(file, 'utf8'))) out.push(rel === '' ? '/' : rel);
  }
  return out.sort();
}
