// Kinloop scaled out: two app instances and two workers of the test stack's
// build, on ports of their own (the test stack's app port + 6 and + 8),
// against the one database and the one S3 stand-in, with a job queue schema
// of their own so that only these two workers read their files. Files
// uploaded through one instance are read through the other, byte for byte;
// every parse job runs once (one attempt, one session per file); a session
// and the sign-in limits hold across both instances.
import { createHash, randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { Http } from '../support/http';
import { appArgs, drillPorts, startProcess, stopAllProcesses, until, workerArgs } from '../support/processes';
import { formFor, rideCsv } from '../support/rides';
import { createWorld, PASSWORD, type World } from '../support/world';

const ports = [drillPorts(6).app, drillPorts(8).app];
const origins = ports.map((p) => `http://127.0.0.1:${p}`);
// A queue of their own: the test stack's worker must not take these instances' jobs.
const queueSchema = `pgboss_instances_${randomUUID().slice(0, 8)}`;

let world: World;

beforeAll(async () => {
  world = await createWorld('instances');
  const env = { KINLOOP_QUEUE_SCHEMA: queueSchema, KINLOOP_PARSE_PROCESSES: '1' };
  await Promise.all([
    ...ports.map((port) => startProcess(appArgs, { ...env, PORT: String(port) }, /kinloop app ready/)),
    startProcess(workerArgs, env, /kinloop worker ready/),
    startProcess(workerArgs, env, /kinloop worker ready/),
  ]);
}, 120_000);

afterAll(async () => {
  await stopAllProcesses();
  await world.knex.raw(`DROP SCHEMA IF EXISTS ${queueSchema} CASCADE`);
  await closeDb();
});

const sha256 = (b: Uint8Array | string) => createHash('sha256').update(b).digest('hex');

describe('two app instances and two workers on one database and one S3', () => {
  it('reads through one instance what was uploaded through the other, and parses each file once', { timeout: 60_000 }, async () => {
    const [a, b] = await Promise.all(origins.map((o) => new Http(o).signIn(world.users.therapist.email, PASSWORD)));
    // Eight rides an hour apart (never near-duplicates of each other), half through each instance, two files per request.
    const start = Date.now() - 10 * 86_400_000;
    const files = Array.from({ length: 8 }, (_, i) => ({ name: `instances-${i}.csv`, content: rideCsv({ startedAt: new Date(start + i * 3_600_000).toISOString() }) }));
    const sent: { uploadId: string; name: string }[] = [];
    for (let i = 0; i < files.length; i += 2) {
      const via = i % 4 === 0 ? a : b;
      const res = await via.request('POST', '/api/uploads', formFor(world.clientId, files.slice(i, i + 2)));
      expect(res.status, await res.clone().text()).toBeLessThan(300);
      for (const f of (await res.json()).files as { uploadId: string; name: string }[]) sent.push({ uploadId: f.uploadId, name: f.name });
    }
    expect(sent).toHaveLength(8);

    // Each read through the instance it was not sent to.
    const settled = await until(
      'uploads read by the two workers',
      () => Promise.all(sent.map((s, i) => (i % 4 < 2 ? b : a).json('GET', `/api/uploads/${s.uploadId}`))),
      (answers) => answers.every((r) => r.status === 200 && r.body.status !== 'queued'),
      45_000,
      300,
    );
    expect(settled.map((r) => r.body.status)).toEqual(Array(8).fill('accepted'));

    // Once each: one attempt, one session per file, eight different sessions.
    const rows = await world.knex('uploads').whereIn('id', sent.map((s) => s.uploadId)).select('id', 'attempts', 'ride_id', 'sha256');
    expect(rows.map((r) => r.attempts)).toEqual(Array(8).fill(1));
    const rides = await world.knex('rides').whereIn('upload_id', sent.map((s) => s.uploadId)).select('id', 'upload_id');
    expect(rides).toHaveLength(8);
    expect(new Set(rides.map((r) => r.id)).size).toBe(8);

    // The stored bytes, through the other instance, are the bytes sent.
    for (const [i, s] of sent.entries()) {
      const via = i % 4 < 2 ? b : a;
      const raw = await via.request('GET', `/api/uploads/${s.uploadId}/raw`);
      expect(raw.status).toBe(200);
      const original = files.find((f) => f.name === s.name)!.content;
      expect(sha256(new Uint8Array(await raw.arrayBuffer()))).toBe(sha256(original));
      const session = await via.json('GET', `/api/sessions/${settled[i].body.sessionId}`);
      expect(session.status).toBe(200);
      expect(session.body.clientId).toBe(world.clientId);
    }
  });

  it('a sign-in on one instance is a session on the other, and sign-out on the other ends it on both', { timeout: 30_000 }, async () => {
    const http = await new Http(origins[0]).signIn(world.users.admin.email, PASSWORD);
    const there = new Http(origins[1]);
    there.cookie = http.cookie;
    there.address = http.address;
    expect((await there.json('GET', '/api/me')).body.email).toBe(world.users.admin.email);
    expect((await there.post('/api/auth/sign-out')).status).toBeLessThan(400);
    expect((await http.get('/api/me')).status).toBe(401);
  });

  it('counts failed sign-ins across both instances: ten wrong passwords, five on each, block the eleventh on either', { timeout: 30_000 }, async () => {
    const email = world.users.carer.email;
    const address = `198.51.100.${Math.floor(Math.random() * 200) + 20}, 2001:db8:1::${randomUUID().slice(0, 4)}`;
    const clients = origins.map((o) => Object.assign(new Http(o), { address }));
    for (let i = 0; i < 10; i++) {
      const r = await clients[i % 2].request('POST', '/api/auth/sign-in', { email, password: `wrong-${i}-password` });
      expect(r.status, `attempt ${i + 1}`).toBe(401);
    }
    for (const c of clients) {
      const blocked = await c.request('POST', '/api/auth/sign-in', { email, password: PASSWORD });
      expect(blocked.status).toBe(429);
      expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0);
    }
  });
});
