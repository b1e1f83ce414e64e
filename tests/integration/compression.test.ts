// Text answers are compressed for clients that say they accept it (pages,
// JSON, the built scripts), binary ones and small ones are not, and what
// comes back decompresses to exactly the bytes an uncompressed request gets.
// Raw requests through node:http, so nothing decompresses behind the test's back.
import http from 'node:http';
import zlib from 'node:zlib';
import { beforeAll, describe, expect, it } from 'vitest';
import { baseUrl } from '../support/browser';
import { createWorld, type World } from '../support/world';


interface Raw {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: Buffer;
}

function get(path: string, headers: Record<string, string>): Promise<Raw> {
  return new Promise((resolve, reject) => {
    const req = http.get(new URL(path, baseUrl()), { headers }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks) }));
      res.on('error', reject);
    });
    req.on('error', reject);
  });
}

let world: World;
let cookie: string;

beforeAll(async () => {
  world = await createWorld('gzip');
  const therapist = await world.as('therapist');
  cookie = [therapist.cookie, therapist.device].filter(Boolean).join('; ');
});

describe('compression of answers', () => {
  it('gzips and brotli-compresses a JSON answer to the same bytes, and says it varies by Accept-Encoding', async () => {
    // The virtual routes of the distance goal: a few kB of JSON for anyone signed in.
    const plain = await get('/api/routes', { cookie, 'accept-encoding': 'identity' });
    expect(plain.status).toBe(200);
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body.length).toBeGreaterThan(1024);

    const gz = await get('/api/routes', { cookie, 'accept-encoding': 'gzip, deflate' });
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(gz.headers.vary).toMatch(/accept-encoding/i);
    expect(gz.body.length).toBeLessThan(plain.body.length / 2);
    expect(zlib.gunzipSync(gz.body).equals(plain.body)).toBe(true);

    // What browsers send: brotli is preferred.
    const br = await get('/api/routes', { cookie, 'accept-encoding': 'gzip, deflate, br, zstd' });
    expect(br.headers['content-encoding']).toBe('br');
    expect(zlib.brotliDecompressSync(br.body).equals(plain.body)).toBe(true);
  });

  it('compresses pages', async () => {
    const page = await get('/sign-in', { 'accept-encoding': 'gzip' });
    expect(page.status).toBe(200);
    expect(page.headers['content-encoding']).toBe('gzip');
    expect(zlib.gunzipSync(page.body).toString('utf8')).toContain('<html');
  });

  it('compresses the API and the built scripts, not answers under 1 kB', async () => {
    const me = await get('/api/me', { cookie, 'accept-encoding': 'gzip' });
    expect(me.status).toBe(200);
    expect(me.body.length).toBeLessThan(1024);
    expect(me.headers['content-encoding']).toBeUndefined();

    const html = (await get('/triage', { cookie, 'accept-encoding': 'identity' })).body.toString('utf8');
    const script = /(?:component-url|renderer-url|src)="(\/_astro\/[^"]+\.js)"/.exec(html)?.[1];
    expect(script).toBeTruthy();
    const plain = await get(script!, { 'accept-encoding': 'identity' });
    const gz = await get(script!, { 'accept-encoding': 'gzip' });
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(zlib.gunzipSync(gz.body).equals(plain.body)).toBe(true);
  });

  it('leaves a client that accepts no encoding with the plain bytes', async () => {
    const r = await get('/sign-in', {});
    expect(r.headers['content-encoding']).toBeUndefined();
    expect(r.body.toString('utf8')).toContain('<html');
  });
});
