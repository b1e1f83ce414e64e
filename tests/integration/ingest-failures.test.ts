// Failures of the parts around ingest: a worker killed in the middle of a job,
// and the object store going away during an upload. Each test runs processes
// of its own (a worker on its own queue schema; an app server with its own
// s3rver), so the shared test stack is never disturbed.
import { spawn, type ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { mkdtempSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Readable } from 'node:stream';
import PgBoss from 'pg-boss';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { putObjectStream } from '../../src/lib/storage/s3';
import { Http } from '../support/http';
import { rideCsv } from '../support/rides';
import { createWorld, PASSWORD, type World } from '../support/world';

const root = process.env.KINLOOP_ROOT ?? process.cwd();
const children: ChildProcess[] = [];

function start(cmd: string, args: string[], env: NodeJS.ProcessEnv, ready: RegExp): Promise<ChildProcess> {
  const child = spawn(cmd, args, { cwd: root, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  children.push(child);
  let out = '';
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`${args.join(' ')} did not start:\n${out}`)), 60_000);
    const onData = (d: Buffer) => {
      out += d.toString();
      if (ready.test(out)) {
        clearTimeout(timer);
        resolve(child);
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    child.on('exit', (code) => {
      clearTimeout(timer);
      if (!ready.test(out)) reject(new Error(`${args.join(' ')} exited ${code}:\n${out}`));
    });
  });
}

function stop(child: ChildProcess, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null) return resolve();
    child.once('exit', () => resolve());
    child.kill(signal);
  });
}

let world: World;
beforeAll(async () => {
  world = await createWorld('failures');
});
afterEach(async () => {
  await Promise.all(children.splice(0).map((c) => stop(c, 'SIGKILL')));
});
afterAll(closeDb);

// The worker runs in one process (node with tsx's loader, not the tsx
// launcher, which keeps a child alive when it is killed) so that SIGKILL
// really ends it.
const worker = ['--import', 'tsx', 'src/worker.ts'];

describe('a worker killed mid-job', () => {
  it('loses nothing: after a restart the job runs again and the file becomes a session', { timeout: 150_000 }, async () => {
    const schema = `pgboss_crash_${randomUUID().slice(0, 8)}`;
    const workerEnv = { KINLOOP_QUEUE_SCHEMA: schema, KINLOOP_QUEUE_MAINTENANCE_S: '1' };
    // A stored file and its queued upload, as POST /api/uploads leaves them.
    const key = `rides/${world.clinicId}/${world.clientId}/${randomUUID()}`;
    const content = rideCsv({ startedAt: '2026-04-01T09:00:00Z' });
    await putObjectStream(key, Readable.from([Buffer.from(content)]));
    const [upload] = await world.knex('uploads')
      .insert({ client_id: world.clientId, clinic_id: world.clinicId, uploaded_by: world.users.carer.id, original_name: 'crash.csv', byte_size: content.length, sha256: randomUUID(), storage_key: key, status: 'queued', enqueued_at: new Date() })
      .returning('id');

    const first = await start(process.execPath, worker, { ...workerEnv, KINLOOP_PARSE_HOLD_MS: '600000' }, /kinloop worker ready/);
    const boss = new PgBoss({ connectionString: process.env.DATABASE_URL!, schema });
    await boss.start();
    try {
      const jobId = (await boss.send('ride-parse', { uploadId: upload.id }, { expireInSeconds: 2, retryDelay: 0 }))!;
      const deadline = Date.now() + 30_000;
      while ((await boss.getJobById('ride-parse', jobId))?.state !== 'active') {
        if (Date.now() > deadline) throw new Error('the job never became active');
        await new Promise((r) => setTimeout(r, 200));
      }
      await stop(first, 'SIGKILL');
      expect((await world.knex('uploads').where({ id: upload.id }).first()).status).toBe('queued');

      await start(process.execPath, worker, workerEnv, /kinloop worker ready/);
      let row = await world.knex('uploads').where({ id: upload.id }).first();
      const until = Date.now() + 90_000;
      while (row.status === 'queued' && Date.now() < until) {
        await new Promise((r) => setTimeout(r, 300));
        row = await world.knex('uploads').where({ id: upload.id }).first();
      }
      expect(row.status).toBe('accepted');
      expect(await world.knex('rides').where({ upload_id: upload.id }).first()).toBeDefined();
    } finally {
      await boss.stop({ graceful: false, wait: true });
      await world.knex.raw(`DROP SCHEMA IF EXISTS ${schema} CASCADE`);
    }
  });
});

describe('the object store stopping during an upload', () => {
  it('answers 503 with a clear message and leaves no upload row pointing at nothing', async () => {
    const base = Number(process.env.KINLOOP_S3_PORT ?? 4578);
    const s3Port = base + 5;
    const appPort = Number(new URL(process.env.KINLOOP_BASE_URL!).port) + 5;
    const s3dir = mkdtempSync(path.join(os.tmpdir(), 'kinloop-s3-'));
    const s3proc = await start(process.execPath, ['s3-fake/launch.mjs', '--port', String(s3Port), '--directory', s3dir, '--bucket', 'kinloop-rides'], {}, /s3-fake ready/);
    await start(process.execPath, ['scripts/serve.mjs'], { PORT: String(appPort), S3_ENDPOINT: `http://127.0.0.1:${s3Port}`, KINLOOP_WORKER: 'off' }, /kinloop app ready/);
    const http = await new Http(`http://127.0.0.1:${appPort}`).signIn(world.users.carer.email, PASSWORD);
    const name = `interrupted-${randomUUID()}.csv`;
    const boundary = `----kinloop${randomUUID()}`;
    const line = '1,active,40,20,60,60\n';
    const chunk = Buffer.from(line.repeat(Math.ceil(256 * 1024 / line.length)));
    let sent = 0;
    const body = new ReadableStream<Uint8Array>({
      async pull(controller) {
        if (sent === 0) {
          controller.enqueue(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="clientId"\r\n\r\n${world.clientId}\r\n--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="${name}"\r\nContent-Type: text/csv\r\n\r\ntime,phase,cadence,power,quad l,quad r\n`));
        } else if (sent < 16) {
          // Half-way through the file, the store goes away.
          if (sent === 8) await stop(s3proc, 'SIGKILL');
          controller.enqueue(chunk);
        } else {
          controller.enqueue(Buffer.from(`\r\n--${boundary}--\r\n`));
          controller.close();
        }
        sent++;
        await new Promise((r) => setTimeout(r, 20));
      },
    });
    const res = await fetch(`${http.origin}/api/uploads`, {
      method: 'POST',
      headers: { cookie: http.cookie!, origin: http.origin, 'content-type': `multipart/form-data; boundary=${boundary}` },
      body,
      duplex: 'half',
    } as RequestInit);
    expect(res.status).toBe(503);
    const error = (await res.json()).error;
    expect(error.code).toBe('storage_unavailable');
    expect(error.message).toMatch(/nothing was saved/i);
    expect(await world.knex('uploads').where({ original_name: name }).first()).toBeUndefined();
    // The instance's health check names what is down.
    const health = await fetch(`${http.origin}/api/health`);
    expect(health.status).toBe(503);
    expect(await health.json()).toMatchObject({ db: 'ok', storage: 'down', mail: 'ok', down: ['storage'] });
  });
});
