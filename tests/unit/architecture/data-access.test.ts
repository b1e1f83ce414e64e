// Every read goes through the data layer, by construction: no page,
// component, endpoint or service imports Knex, the database driver or the
// pool; code that runs with no viewer to scope it uses a named system
// accessor of the layer, and only the files listed here may. See
// DEVELOPERS.md, "Data access".
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = path.resolve(__dirname, '../../..');
const LAYER = ['src/lib/db/', 'src/lib/data/'];

/** Packages that reach the database. */
const DATABASE_PACKAGES = new Set(['knex', 'pg', 'pg-copy-streams']);

/**
 * Who may use each system accessor, and why: work done on no one's behalf.
 * A file not listed here that imports one fails.
 */
const SYSTEM_ACCESSORS: Record<string, { files: (string | RegExp)[]; why: string }> = {
  workerDb: { files: ['src/lib/jobs/background.ts', 'src/lib/supervision/flag-jobs.ts'], why: 'the worker’s jobs act for every clinic' },
  authDb: {
    files: [
      'src/middleware.ts',
      'src/pages/api/auth/sign-in.ts',
      'src/pages/api/auth/reset-request.ts',
      'src/pages/api/auth/reset.ts',
      'src/pages/api/invitations/accept.ts',
      'src/pages/sign-in.astro',
      'src/pages/reset/[token].astro',
      'src/pages/invite/[token].astro',
      'src/pages/unsubscribe/[token].astro',
    ],
    why: 'sign-in, reset links, invitations and unsubscribe links come before a viewer exists',
  },
  maintenanceDb: { files: [/^scripts\//], why: 'seeding and maintenance scripts' },
  maintenanceKnex: { files: [/^scripts\//], why: 'bulk loads, DDL and ANALYZE in maintenance scripts' },
  closeDatabase: { files: ['src/worker.ts', /^scripts\//], why: 'a process that ends closes the pool' },
  databaseAnswers: { files: ['src/lib/health/health.ts'], why: 'the health check' },
};
/** Layer internals that hand out unrestricted connections. */
const LAYER_INTERNALS = new Set(['makeDb', 'connectionOf', 'systemPolicy']);
/** Maintenance scripts do what no request does (COPY, DDL, ANALYZE): the driver, Knex's types and the migration runner. */
const SCRIPT_EXCEPTIONS = [/^scripts\//];

export interface Source {
  file: string;
  text: string;
}

interface Import {
  specifier: string;
  names: string[];
}

const IMPORT = /(?:^|[;\s])(?:import|export)\s+(?:type\s+)?([\s\S]*?)\s*from\s*['"]([^'"]+)['"]|(?:^|[^\w.])import\s*\(\s*['"]([^'"]+)['"]\s*\)|(?:^|[;\s])import\s+['"]([^'"]+)['"]/g;

export function importsOf(text: string): Import[] {
  const out: Import[] = [];
  for (const m of text.matchAll(IMPORT)) {
    const specifier = m[2] ?? m[3] ?? m[4];
    const clause = m[1] ?? '';
    const braces = /\{([\s\S]*)\}/.exec(clause);
    const names = braces
      ? braces[1]
          .split(',')
          .map((n) => n.trim().replace(/^type\s+/, '').split(/\s+as\s+/)[0])
          .filter(Boolean)
      : [];
    out.push({ specifier, names });
  }
  return out;
}

/** The repository path an import names (relative specifiers resolved; packages as they are). */
function target(file: string, specifier: string): string {
  if (!specifier.startsWith('.')) return specifier;
  return path.posix.normalize(path.posix.join(path.posix.dirname(file), specifier)).replace(/\.(ts|tsx|mjs|js)$/, '');
}

const matches = (file: string, patterns: (string | RegExp)[]) => patterns.some((p) => (typeof p === 'string' ? p === file : p.test(file)));

/** What in `sources` breaks the rule, one line per import. */
export function violations(sources: Source[]): string[] {
  const out: string[] = [];
  for (const { file, text } of sources) {
    if (LAYER.some((l) => file.startsWith(l))) continue;
    const script = matches(file, SCRIPT_EXCEPTIONS);
    for (const { specifier, names } of importsOf(text)) {
      const to = target(file, specifier);
      const pkg = to.startsWith('@') ? to.split('/').slice(0, 2).join('/') : to.split('/')[0];
      if (DATABASE_PACKAGES.has(pkg) && !script) out.push(`${file} imports ${specifier}: read and write through src/lib/data (scope(ctx), or a system accessor)`);
      if (to === 'src/lib/db/knex') out.push(`${file} imports the pool (${specifier}): use scope(ctx), or a system accessor of src/lib/data`);
      if (to.startsWith('src/lib/db/') && to !== 'src/lib/db/knex' && to !== 'src/lib/db/tables' && !script) out.push(`${file} imports ${specifier}: only the layer and maintenance scripts use src/lib/db beyond its row types`);
      if (to === 'src/lib/data' || to === 'src/lib/data/index' || to.startsWith('src/lib/data/')) {
        for (const name of names) {
          const rule = SYSTEM_ACCESSORS[name];
          if (rule && !matches(file, rule.files)) out.push(`${file} imports ${name} (for ${rule.why}): a request uses scope(ctx); add the file to SYSTEM_ACCESSORS only if it runs with no viewer`);
          if (LAYER_INTERNALS.has(name)) out.push(`${file} imports ${name}, which hands out unrestricted connections: only the layer uses it`);
        }
      }
    }
  }
  return out;
}

function walk(dir: string): string[] {
  return readdirSync(path.join(ROOT, dir)).flatMap((name) => {
    const rel = `${dir}/${name}`;
    if (statSync(path.join(ROOT, rel)).isDirectory()) return walk(rel);
    return /\.(ts|tsx|mjs|js|astro)$/.test(name) ? [rel] : [];
  });
}

describe('data access', () => {
  it('goes through src/lib/data everywhere: no page, component, endpoint, service or script touches the pool or Knex outside the layer', () => {
    const files = [...walk('src'), ...walk('scripts')];
    expect(files.length).toBeGreaterThan(200);
    expect(violations(files.map((file) => ({ file, text: readFileSync(path.join(ROOT, file), 'utf8') })))).toEqual([]);
  });

  it('catches a page, a service and an endpoint that reach the database themselves', () => {
    const page = `---\nimport { signedIn } from '../../lib/auth/context';\nimport { db } from '../../lib/db/knex';\nconst rows = await db()('clients');\n---\n<p>{rows.length}</p>`;
    const service = `import type { Knex } from 'knex';\nimport { scope } from '../data';\nexport const all = (knex: Knex) => knex('rides');`;
    const endpoint = `import { workerDb } from '../../../lib/data';\nexport const GET = () => workerDb()('flags');`;
    const lazy = `export async function later() { const { db } = await import('../db/knex'); return db(); }`;
    expect(
      violations([
        { file: 'src/pages/clients/list.astro', text: page },
        { file: 'src/lib/clients/all.ts', text: service },
        { file: 'src/pages/api/flags/all.ts', text: endpoint },
        { file: 'src/lib/clients/later.ts', text: lazy },
        // The same imports inside the layer, and a maintenance script's bulk load, are allowed.
        { file: 'src/lib/data/extra.ts', text: service },
        { file: 'scripts/load.ts', text: `import pg from 'pg';\nimport { maintenanceKnex } from '../src/lib/data';` },
      ]),
    ).toEqual([
      'src/pages/clients/list.astro imports the pool (../../lib/db/knex): use scope(ctx), or a system accessor of src/lib/data',
      'src/lib/clients/all.ts imports knex: read and write through src/lib/data (scope(ctx), or a system accessor)',
      'src/pages/api/flags/all.ts imports workerDb (for the worker’s jobs act for every clinic): a request uses scope(ctx); add the file to SYSTEM_ACCESSORS only if it runs with no viewer',
      'src/lib/clients/later.ts imports the pool (../db/knex): use scope(ctx), or a system accessor of src/lib/data',
    ]);
  });
});
