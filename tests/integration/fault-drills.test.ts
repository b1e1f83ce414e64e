// Fault drills on an app server of the drill's own (the test stack's database
// and stores; its own port, or its own PostgreSQL cluster): a client that
// drops the connection mid-upload, the app killed mid-upload, and PostgreSQL
// restarted under the running app. The shared test stack is never disturbed.
import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import { randomUUID } from 'node:crypto';
import { rmSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import knexFactory from 'knex';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { hashPassword } from '../../src/lib/auth/password';
import { config } from '../../src/lib/config';
import { closeDb } from '../../src/lib/db/knex';
import { sweepOrphanObjects } from '../../src/lib/ingest/sweep';
import { s3 } from '../../src/lib/storage/s3';
import { appEnv, resolveConfig } from '../../scripts/lib/config.mjs';
import { startPostgres } from '../../scripts/lib/services.mjs';
import { Http } from '../support/http';
import { appArgs, drillPorts, root, startProcess, stopAllProcesses, stopProcess, until, type Started } from '../support/processes';
import { formFor, rideCsv } from '../support/rides';
import { createWorld, PASSWORD, type World } from '../support/world';

let world: World;
beforeAll(async () => {
  world = await createWorld('drills');
});
afterEach(stopAllProcesses);
afterAll(closeDb);

const ports = drillPorts(3);
const origin = `http://127.0.0.1:${ports.app}`;
const startApp = (env: NodeJS.ProcessEnv = {}) => startProcess(appArgs, { PORT: String(ports.app), ...env }, /kinloop app ready/);

async function objectsUnder(prefix: string): Promise<string[]> {
  const res = await s3().send(new ListObjectsV2Command({ Bucket: config().s3.bucket, Prefix: prefix }));
  return (res.Contents ?? []).map((o) => o.Key!);
}

/**
 * Starts a multipart upload over a plain socket: the form up to the file's
 * first `bytes` bytes, declaring a larger body than it sends. Resolves once
 * the server has read them (the socket drained), with the socket to cut.
 */
async function partialUpload(http: Http, name: string, bytes: number): Promise<net.Socket> {
  const boundary = `----drill${randomUUID()}`;
  const head = Buffer.from(
    `--${boundary}\r\nContent-Disposition: form-data; name="clientId"\r\n\r\n${world.clientId}\r\n` +
      `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="${name}"\r\nContent-Type: text/csv\r\n\r\ntime,phase,cadence,power,quad l,quad r\n`,
  );
  const line = '1,active,40,20,60,60\n';
  const socket = net.connect(ports.app, '127.0.0.1');
  await new Promise((r) => socket.once('connect', r));
  socket.on('error', () => undefined);
  socket.write(
    [
      'POST /api/uploads HTTP/1.1',
      `Host: 127.0.0.1:${ports.app}`,
      `Cookie: ${http.cookie}`,
      `Origin: ${origin}`,
      `X-Forwarded-For: ${http.address}`,
      `Content-Type: multipart/form-data; boundary=${boundary}`,
      `Content-Length: ${head.length + bytes * 2}`,
      '',
      '',
    ].join('\r\n'),
  );
  socket.write(head);
  const chunk = Buffer.from(line.repeat(Math.ceil((64 * 1024) / line.length)));
  for (let sent = 0; sent < bytes; sent += chunk.length) {
    if (!socket.write(chunk)) await new Promise((r) => socket.once('drain', r));
  }
  // Let the server take what is in flight.
  await new Promise((r) => setTimeout(r, 500));
  return socket;
}

describe('a client that drops the connection mid-upload', () => {
  it('leaves the server up and answering, nothing stored, and the next upload works', { timeout: 90_000 }, async () => {
    const app = await startApp();
    const http = await new Http(origin).signIn(world.users.carer.email, PASSWORD);
    const prefix = `rides/${world.clinicId}/${world.clientId}/`;
    const before = (await objectsUnder(prefix)).sort();
    for (const [i, bytes] of [6 * 1024 * 1024, 200 * 1024].entries()) {
      // Past the storage client's first 5 MiB part, and a small one still in its buffer.
      const name = `dropped-${i}-${randomUUID()}.csv`;
      const socket = await partialUpload(http, name, bytes);
      socket.destroy();
      const t0 = Date.now();
      const health = await fetch(`${origin}/api/health`);
      expect(health.status).toBe(200);
      expect(Date.now() - t0).toBeLessThan(5000);
      await until('objects of the dropped upload removed', async () => (await objectsUnder(prefix)).sort(), (keys) => keys.join() === before.join(), 15_000);
      expect(await world.knex('uploads').where({ original_name: name }).first()).toBeUndefined();
    }
    expect(app.child.exitCode).toBeNull();
    expect(app.output()).toMatch(/upload interrupted/);
    expect(app.output()).not.toMatch(/uncaught/i);

    const next = await http.json('POST', '/api/uploads?wait=0', formFor(world.clientId, [{ name: 'after-drop.csv', content: rideCsv({ startedAt: '2026-05-01T09:00:00Z' }) }]));
    expect(next.status).toBe(202);
    expect(await world.knex('uploads').where({ id: next.body.files[0].uploadId }).first()).toBeDefined();
  });
});

describe('the app killed mid-upload', () => {
  it('leaves no row without its object and, after the sweep, no object without its row; the same file uploads again', { timeout: 90_000 }, async () => {
    const prefix = `rides/${world.clinicId}/${world.clientId}/`;
    let app: Started = await startApp();
    const http = await new Http(origin).signIn(world.users.carer.email, PASSWORD);
    const name = `killed-${randomUUID()}.csv`;
    const socket = await partialUpload(http, name, 6 * 1024 * 1024);
    await stopProcess(app.child, 'SIGKILL');
    socket.destroy();

    expect(await world.knex('uploads').where({ original_name: name }).first()).toBeUndefined();
    // An hour later the sweep has removed whatever the killed request stored.
    await sweepOrphanObjects(world.knex, { now: new Date(Date.now() + 61 * 60_000), prefix });
    const keys = await objectsUnder(prefix);
    const named = new Set((await world.knex('uploads').whereIn('storage_key', keys).select('storage_key')).map((r: { storage_key: string }) => r.storage_key));
    expect(keys.filter((k) => !named.has(k))).toEqual([]);

    app = await startApp();
    const again = await http.json('POST', '/api/uploads?wait=0', formFor(world.clientId, [{ name, content: rideCsv({ startedAt: '2026-05-03T09:00:00Z' }) }]));
    expect(again.status).toBe(202);
    const row = await world.knex('uploads').where({ id: again.body.files[0].uploadId }).first();
    expect(await objectsUnder(row.storage_key)).toEqual([row.storage_key]);
  });
});

describe('a clinic at its storage quota', () => {
  it('is refused with 507 before a byte is stored, and says how much is used of how much', { timeout: 60_000 }, async () => {
    // 0.0001 GB is 107,374 bytes (1 GB = 1024³ bytes here): room for the first file, not for the second.
    await startApp({ KINLOOP_CLINIC_STORAGE_GB: '0.0001' });
    const therapist = await new Http(origin).signIn(world.users.therapist.email, PASSWORD);
    const prefix = `rides/${world.clinicId}/${world.otherClientId}/`;
    const file = (startedAt: string) => [{ name: `quota-${startedAt}.csv`, content: rideCsv({ startedAt, minutes: 45 }) }];
    const first = await therapist.json('POST', '/api/uploads?wait=0', formFor(world.otherClientId, file('2026-05-05T09:00:00Z')));
    expect(first.status).toBe(202);
    const objects = await objectsUnder(prefix);
    const second = await therapist.json('POST', '/api/uploads?wait=0', formFor(world.otherClientId, file('2026-05-06T09:00:00Z')));
    expect(second.status).toBe(507);
    expect(second.body.error.code).toBe('storage_quota_exceeded');
    expect(second.body.error.message).toMatch(/storage for ride files is full \(.+ of .+ used\), so nothing from this upload was saved/);
    expect(await objectsUnder(prefix)).toEqual(objects);
    expect(await world.knex('uploads').where({ original_name: 'quota-2026-05-06T09:00:00Z.csv' }).first()).toBeUndefined();
  });
});

describe('PostgreSQL restarted under a running app', () => {
  const pgPort = drillPorts(4).pg;
  const appPort = drillPorts(4).app;
  const dataDir = path.join(process.env.KINLOOP_DATA_DIR ?? path.join(root, '.data-test'), `drill-pg-${process.pid}`);
  let stopPg: (() => void) | null = null;
  afterAll(() => {
    stopPg?.();
    rmSync(dataDir, { recursive: true, force: true });
  });

  it('answers 503 naming the database while it is down, and recovers without a restart', { timeout: 150_000 }, async () => {
    const drill = resolveConfig(
      {},
      { root, defaults: { KINLOOP_DATA_DIR: dataDir, KINLOOP_PG_PORT: String(pgPort), PORT: String(appPort), S3_ENDPOINT: process.env.S3_ENDPOINT!, SMTP_URL: process.env.SMTP_URL!, KINLOOP_BUILD_DIR: process.env.KINLOOP_BUILD_DIR! } },
    );
    Object.assign(drill, { pgFsync: 'off' });
    const pgBin = process.env.KINLOOP_PG_BIN!;
    stopPg = startPostgres(pgBin, drill);
    const env = appEnv(drill, { NODE_ENV: 'production', KINLOOP_TRUST_PROXY: '1' });
    // Migrations run as the owner role, the app as its own, as npm start does.
    await startProcess(['--import', 'tsx', 'scripts/db.ts', 'migrate'], { ...env, DATABASE_OWNER_URL: drill.databaseOwnerUrl! }, /migrations applied|up to date/);
    const knex = knexFactory({ client: 'pg', connection: drill.databaseUrl, pool: { min: 0, max: 2 } });
    try {
      const email = `drill-${randomUUID().slice(0, 8)}@example.test`;
      await knex('users').insert({ email, name: 'Drill Person', password_hash: await hashPassword(PASSWORD) });
      const app = await startProcess(appArgs, env, /kinloop app ready/);
      const http = await new Http(`http://127.0.0.1:${appPort}`).signIn(email, PASSWORD);
      expect((await http.json('GET', '/api/me')).status).toBe(200);

      stopPg();
      // As a monitoring probe asks: without a session.
      const health = await fetch(`http://127.0.0.1:${appPort}/api/health`);
      expect(health.status).toBe(503);
      const status = await health.json();
      expect(status).toMatchObject({ db: 'down', down: ['db'] });
      expect(status.message).toMatch(/database/);
      const me = await http.json('GET', '/api/me');
      expect(me.status).toBe(503);
      expect(me.body.error.code).toBe('database_unavailable');
      expect(me.body.error.message).toMatch(/cannot reach its database.*Try again/);

      stopPg = startPostgres(pgBin, drill);
      await until('health after the restart', async () => (await fetch(`http://127.0.0.1:${appPort}/api/health`)).status, (s) => s === 200, 30_000);
      expect((await http.json('GET', '/api/me')).status).toBe(200);
      // The same process all along: it recovered by itself.
      expect(app.child.exitCode).toBeNull();
      expect(app.output()).not.toMatch(/uncaught/i);
    } finally {
      await knex.destroy();
    }
  });
});
