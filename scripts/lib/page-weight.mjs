// The JavaScript a server-rendered page makes the browser load, read from
// the build output: the page's module scripts, module preloads and island
// components and renderers, followed through their static imports
// (es-module-lexer). Chunks reached only through a dynamic import() load
// later, when the code that needs them runs; they are counted apart.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { init, parse } from 'es-module-lexer';

const ATTRIBUTE_URLS = [
  /<script\b[^>]*\btype="module"[^>]*\bsrc="([^"]+)"/g,
  /<script\b[^>]*\bsrc="([^"]+)"[^>]*\btype="module"/g,
  /<link\b[^>]*\brel="modulepreload"[^>]*\bhref="([^"]+)"/g,
  /<link\b[^>]*\bhref="([^"]+)"[^>]*\brel="modulepreload"/g,
  /\bcomponent-url="([^"]+)"/g,
  /\brenderer-url="([^"]+)"/g,
];
const INLINE_SCRIPT = /<script\b(?![^>]*\bsrc=)([^>]*)>([\s\S]*?)<\/script>/g;
const SCRIPT_TYPE = /\btype="([^"]+)"/;
const isJavaScript = (attributes) => {
  const type = SCRIPT_TYPE.exec(attributes)?.[1];
  return type === undefined || type === 'module' || type === 'text/javascript';
};

/** gzip at zlib's default level, which is what a compressing server or proxy usually sends. */
const gzipped = (bytes) => gzipSync(bytes).length;

/**
 * @param {string} html the page as served
 * @param {string} clientDir the build's client folder (where /_astro/… files live)
 */
export async function pageWeight(html, clientDir) {
  await init;
  const entries = new Set();
  for (const pattern of ATTRIBUTE_URLS) for (const m of html.matchAll(pattern)) entries.add(decodeEntities(m[1]));
  const inline = [...html.matchAll(INLINE_SCRIPT)].filter((m) => isJavaScript(m[1]) && m[2].trim()).map((m) => m[2]);
  for (const code of inline) for (const spec of staticImports(code).statics) if (spec.startsWith('/')) entries.add(spec);

  const loaded = new Map();
  const lazyRoots = new Set();
  const walk = (url, into) => {
    if (into.has(url) || (into !== loaded && loaded.has(url))) return;
    const file = path.join(clientDir, url.split('?')[0]);
    const bytes = readFileSync(file);
    into.set(url, bytes);
    const { statics, dynamics } = staticImports(bytes.toString('utf8'));
    for (const spec of statics) walk(resolveUrl(url, spec), into);
    for (const spec of dynamics) lazyRoots.add(resolveUrl(url, spec));
  };
  for (const url of entries) if (url.endsWith('.js') || url.includes('.js?')) walk(url, loaded);
  const lazy = new Map();
  for (const url of lazyRoots) walk(url, lazy);
  for (const url of loaded.keys()) lazy.delete(url);

  const sum = (files) => [...files.values()].reduce((acc, b) => ({ raw: acc.raw + b.length, gzip: acc.gzip + gzipped(b) }), { raw: 0, gzip: 0 });
  const inlineBytes = Buffer.from(inline.join('\n'));
  return {
    files: [...loaded.keys()],
    onLoad: sum(loaded),
    inline: { raw: inlineBytes.length, gzip: inline.length ? gzipped(inlineBytes) : 0 },
    lazyFiles: [...lazy.keys()],
    lazy: sum(lazy),
  };
}

function staticImports(code) {
  const [imports] = parse(code);
  const statics = [];
  const dynamics = [];
  for (const i of imports) {
    if (!i.n) continue;
    // d === -1: a static import or export-from; d > -1: import(); d === -2: import.meta.
    if (i.d === -1) statics.push(i.n);
    else if (i.d > -1) dynamics.push(i.n);
  }
  return { statics, dynamics };
}

function resolveUrl(from, spec) {
  if (spec.startsWith('/')) return spec;
  return new URL(spec, `http://page${from}`).pathname;
}

function decodeEntities(s) {
  return s.replace(/&amp;/g, '&').replace(/&#x2F;/gi, '/');
}

const TARGET_KB = 200;

/**
 * The five pages of the page-weight budget, each fetched as the role that
 * uses it from a running demo instance, weighed against its build folder.
 */
export async function measurePages(config, staff, password, BenchSession) {
  const rider = await new BenchSession(config.port).signIn('client@kinloop.test', password);
  const carer = await new BenchSession(config.port).signIn('carer@kinloop.test', password);
  const { clients } = await staff.json('/api/clients?q=Jonah%20Pryce');
  const jonah = clients.find((c) => c.name === 'Jonah Pryce') ?? (await staff.json('/api/clients')).clients[0];
  const { sessions } = await staff.json(`/api/clients/${jonah.id}/sessions?limit=1`);
  const pages = [
    ['/triage', staff],
    [`/clients/${jonah.id}`, staff, '/clients/:id'],
    [`/sessions/${sessions[0].id}`, staff, '/sessions/:id'],
    ['/my-week', rider],
    ['/upload', carer],
  ];
  const clientDir = path.join(config.buildDir, 'client');
  const out = [];
  for (const [url, who, label] of pages) out.push({ page: label ?? url, ...(await pageWeight(await who.html(url), clientDir)) });
  return out;
}

export function printPages(pages) {
  const kb = (b) => `${(b / 1000).toFixed(1)} kB`;
  const lines = ['', `JavaScript each page loads (build output, gzip at zlib's default level; target ≤ ${TARGET_KB} kB on load)`];
  lines.push(`${'page'.padEnd(15)}${'files'.padStart(6)}${'on load'.padStart(12)}${'gzip'.padStart(11)}${'inline gzip'.padStart(13)}${'lazy gzip'.padStart(12)}`);
  for (const p of pages) {
    const flag = p.onLoad.gzip + p.inline.gzip > TARGET_KB * 1000 ? '  over the target' : '';
    lines.push(`${p.page.padEnd(15)}${String(p.files.length).padStart(6)}${kb(p.onLoad.raw).padStart(12)}${kb(p.onLoad.gzip).padStart(11)}${kb(p.inline.gzip).padStart(13)}${kb(p.lazy.gzip).padStart(12)}${flag}`);
  }
  lines.push('on load = module scripts, preloads and island components with their static imports; lazy = reached only through import().');
  console.log(lines.join('\n'));
}
