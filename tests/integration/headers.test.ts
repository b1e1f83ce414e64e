// Security headers on every kind of answer: pages (a CSP whose script-src has
// Astro's hashes, no 'unsafe-inline'), API answers, redirects, static files;
// no-store on the pages that carry a token; HSTS when PUBLIC_URL is https.
import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { Http } from '../support/http';
import { createWorld, type World } from '../support/world';

let world: World;
const children: ChildProcess[] = [];
beforeAll(async () => {
  world = await createWorld('headers');
});
afterAll(async () => {
  await Promise.all(children.map((c) => new Promise<void>((r) => (c.exitCode !== null ? r() : (c.once('exit', () => r()), c.kill('SIGKILL'))))));
  await closeDb();
});

// source: OWASP Secure Headers Project, the headers every answer carries here.
const EVERYWHERE = ['x-content-type-options', 'referrer-policy', 'x-frame-options', 'content-security-policy', 'permissions-policy'];

function directives(csp: string | null): Map<string, string[]> {
  return new Map(
    (csp ?? '')
      .split(';')
      .map((d) => d.trim().split(/\s+/))
      .filter((d) => d[0])
      .map(([name, ...values]) => [name, values]),
  );
}

function expectBaseHeaders(res: Response, what: string) {
  for (const h of EVERYWHERE) expect(res.headers.get(h), `${h} on ${what}`).toBeTruthy();
  expect(res.headers.get('x-content-type-options'), what).toBe('nosniff');
}

/** A static file of the build, as a page links it. */
async function assetPath(): Promise<string> {
  const html = await (await new Http().get('/sign-in')).text();
  const m = html.match(/(?:src|href)="(\/_astro\/[^"]+\.(?:js|css))"/);
  if (!m) throw new Error('no /_astro asset linked from the sign-in page');
  return m[1];
}

describe('content security policy of pages', () => {
  it('script-src has hashes and never unsafe-inline, on public and signed-in pages', async () => {
    const therapist = await world.as('therapist');
    for (const [http, path] of [[new Http(), '/sign-in'], [new Http(), '/forgot-password'], [therapist, '/triage'], [therapist, `/clients/${world.clientId}`]] as const) {
      const res = await http.get(path);
      expect(res.status, path).toBe(200);
      const csp = directives(res.headers.get('content-security-policy'));
      const scripts = csp.get('script-src') ?? [];
      expect(scripts, path).not.toContain("'unsafe-inline'");
      expect(scripts, path).not.toContain("'unsafe-eval'");
      expect(scripts.some((s) => s.startsWith("'sha256-")), path).toBe(true);
      expect(csp.get('frame-ancestors'), path).toEqual(["'none'"]);
      expect(csp.get('object-src'), path).toEqual(["'none'"]);
      expect(csp.get('default-src'), path).toEqual(["'self'"]);
      expectBaseHeaders(res, path);
    }
  });
});

describe('the same headers on every kind of answer', () => {
  it('an API answer, a refused API call, a redirect, the adapter’s static files and a missing page', async () => {
    const cases: [string, Response][] = [
      ['API answer', await new Http().get('/api/health')],
      ['refused API call', await new Http().get('/api/me')],
      ['redirect to sign-in', await new Http().get('/clients')],
      ['static file (public/)', await new Http().get('/favicon.svg')],
      ['static file (build)', await new Http().get(await assetPath())],
      ['missing page', await new Http().get('/no-such-page')],
    ];
    expect(cases[2][1].status).toBe(302);
    expect(cases[3][1].status).toBe(200);
    expect(cases[4][1].status).toBe(200);
    for (const [what, res] of cases) {
      expectBaseHeaders(res, what);
      await res.arrayBuffer();
    }
    // What is not a page lets nothing run or load.
    expect(directives(cases[0][1].headers.get('content-security-policy')).get('default-src')).toEqual(["'none'"]);
  });

  it('no HSTS while PUBLIC_URL is plain http', async () => {
    expect((await new Http().get('/sign-in')).headers.get('strict-transport-security')).toBeNull();
  });
});

describe('pages that carry a token are never stored', () => {
  it('invitation, reset and unsubscribe pages answer Cache-Control: no-store, valid link or not', async () => {
    const token = 'a'.repeat(43);
    for (const path of [`/invite/${token}`, `/reset/${token}`, `/unsubscribe/${token}?topic=reminders`, '/sign-in']) {
      const res = await new Http().get(path);
      expect(res.headers.get('cache-control'), path).toBe('no-store');
      await res.arrayBuffer();
    }
  });
});

describe('HSTS when PUBLIC_URL is https', () => {
  it('an instance whose PUBLIC_URL is https sends Strict-Transport-Security on pages, API, redirects and static files', { timeout: 90_000 }, async () => {
    // A second server of the same build (port: the stack's + 3, used by no other test).
    const port = Number(new URL(process.env.KINLOOP_BASE_URL!).port) + 3;
    const app = spawn(process.execPath, ['scripts/serve.mjs'], {
      cwd: process.env.KINLOOP_ROOT ?? process.cwd(),
      env: { ...process.env, PORT: String(port), PUBLIC_URL: `https://localhost:${port}`, KINLOOP_WORKER: 'off' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    children.push(app);
    await new Promise<void>((resolve, reject) => {
      let out = '';
      const onData = (d: Buffer) => {
        out += d.toString();
        if (/kinloop app ready/.test(out)) resolve();
      };
      app.stdout!.on('data', onData);
      app.stderr!.on('data', onData);
      app.on('exit', (code) => reject(new Error(`the https-configured app exited (${code}):\n${out}`)));
    });
    const base = `http://127.0.0.1:${port}`;
    const asset = await assetPath();
    for (const path of ['/sign-in', '/api/health', '/clients', asset]) {
      const res = await fetch(base + path, { redirect: 'manual' });
      // source: RFC 6797 §6.1 (max-age in seconds); a year is common practice
      expect(res.headers.get('strict-transport-security'), path).toBe('max-age=31536000; includeSubDomains');
      await res.arrayBuffer();
    }
  });
});
