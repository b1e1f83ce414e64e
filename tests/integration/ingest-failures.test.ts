// Fault drills around reading ride files: a worker killed in the middle of a
// job, a file that cannot be read on any try, and the object store going away
// during an upload and while jobs wait. Each runs processes of its own (a
// worker on its own queue schema; an app server with its own s3rver), so the
// shared test stack is never disturbed.
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
import {
  alive,
  appArgs,
  childrenOf,
  drillPorts,
  s3Args,
  startProcess,
  stopAllProcesses,
  stopProcess,
  until,
  workerArgs,
} from '../support/processes';
import { formFor, rideCsv } from '../support/rides';
import { createWorld, PASSWORD, type World } from '../support/world';

let world: World;
beforeAll(async () => {
  world = await createWorld('failures');
});
afterEach(stopAllProcesses);
afterAll(closeDb);

/** A stored file and its queued upload, as POST /api/uploads leaves them. */
async function queuedUpload(name: string, content = rideCsv({ startedAt: new Date(Date.UTC(2026, 3, 1) + Math.random() * 1e9).toISOString() })) {
  const key = `rides/${world.clinicId}/${world.clientId}/${randomUUID()}`;
  await putObjectStream(key, Readable.from([Buffer.from(content)]));
  const [upload] = await world.knex('uploads')
    .insert({ client_id: world.clientId, clinic_id: world.clinicId, uploaded_by: world.users.carer.id, original_name: name, byte_size: content.length, sha256: randomUUID(), storage_key: key, status: 'queued', enqueued_at: new Date() })
    .returning(['id', 'storage_key']);
  return upload as { id: string; storage_key: string };
}

/** A job queue of the drill's own, and the environment of a worker that works it. */
async function ownQueue(extra: NodeJS.ProcessEnv = {}) {
  const schema = `pgboss_drill_${randomUUID().slice(0, 8)}`;
  const env = { KINLOOP_QUEUE_SCHEMA: schema, KINLOOP_QUEUE_MAINTENANCE_S: '1', ...extra };
  const boss = new PgBoss({ connectionString: process.env.DATABASE_URL!, schema });
  await boss.start();
  return {
    env,
    boss,
    async close() {
      await boss.stop({ graceful: false, wait: true });
      await world.knex.raw(`DROP SCHEMA IF EXISTS ${schema} CASCADE`);
    },
    jobState: async (id: string) => (await boss.getJobById('ride-parse', id))?.state,
  };
}

const uploadRow = (id: string) => world.knex('uploads').where({ id }).first();

describe('a worker killed mid-job', () => {
  it('after the session is committed, before the job is done: the job runs again and the session appears exactly once', { timeout: 120_000 }, async () => {
    const upload = await queuedUpload('crash.csv');
    const q = await ownQueue();
    // Two connections of the test's own: one holds the client's placement lock
    // (as a long parse would), the other the job table (so the worker cannot
    // report the job done).
    const placement = await world.knex.client.acquireConnection();
    const jobs = await world.knex.client.acquireConnection();
    const lockPlacement = () => placement.query('SELECT pg_advisory_lock(hashtextextended($1, 0))', [`rides:${world.clientId}`]);

    // A waiting request for that advisory lock (its key's low 32 bits are pg_locks.objid).
    const waitingForLock = () =>
      until(
        'worker waiting for the placement lock',
        async () =>
          (await world.knex.raw(`SELECT count(*)::int AS n FROM pg_locks WHERE locktype = 'advisory' AND NOT granted AND objid::bigint = (hashtextextended(?, 0) & 4294967295)`, [`rides:${world.clientId}`])).rows[0].n,
        (n) => n > 0,
      );
    try {
      await lockPlacement();
      const first = await startProcess(workerArgs, q.env, /kinloop worker ready/);
      // The job expires 4 s after a worker took it: then the queue gives it to the next worker.
      const jobId = (await q.boss.send('ride-parse', { uploadId: upload.id }, { expireInSeconds: 4, retryDelay: 0 }))!;
      expect(jobId).toBeTruthy();
      // The file has been read (in a parse process) and the worker waits to place the session.
      await waitingForLock();
      const parsers = await childrenOf(first.child.pid!);
      expect(parsers.length).toBeGreaterThan(0);
      // Hold the job table too, so that the worker cannot report the job done; then let it commit.
      await jobs.query('BEGIN');
      await jobs.query(`LOCK TABLE ${q.env.KINLOOP_QUEUE_SCHEMA}.job IN EXCLUSIVE MODE`);
      await placement.query('SELECT pg_advisory_unlock_all()');
      await until('session committed', () => uploadRow(upload.id), (r) => r.status === 'accepted');
      // Killed after the session was committed, before the job was marked done.
      await stopProcess(first.child, 'SIGKILL');
      await jobs.query('ROLLBACK');
      expect(await q.jobState(jobId)).not.toBe('completed');
      // Its parse process ends with it.
      await until('parse process of the killed worker', async () => parsers.filter(alive).length, (n) => n === 0, 10_000);

      // The job runs again on the next worker and finds the upload read.
      await startProcess(workerArgs, q.env, /kinloop worker ready/);
      await until('job done', () => q.jobState(jobId), (s) => s === 'completed', 60_000);
      const rides = await world.knex('rides').where({ upload_id: upload.id });
      expect(rides).toHaveLength(1);
      expect((await uploadRow(upload.id)).ride_id).toBe(rides[0].id);
    } finally {
      await placement.query('SELECT pg_advisory_unlock_all()').catch(() => undefined);
      await jobs.query('ROLLBACK').catch(() => undefined);
      world.knex.client.releaseConnection(placement);
      world.knex.client.releaseConnection(jobs);
      await stopAllProcesses();
      await q.close();
    }
  });
});

describe('a file that cannot be read on any try', () => {
  it('ends failed with the last error when its job runs out of retries, and its uploader can try again', { timeout: 90_000 }, async () => {
    // The upload's object is missing: every read fails the same way.
    const upload = await queuedUpload('lost-object.csv');
    const content = rideCsv({ startedAt: '2026-04-20T09:00:00Z' });
    await world.knex('uploads').where({ id: upload.id }).update({ storage_key: `${upload.storage_key}-missing` });
    const q = await ownQueue();
    try {
      await startProcess(workerArgs, q.env, /kinloop worker ready/);
      expect(await q.boss.send('ride-parse', { uploadId: upload.id }, { retryLimit: 1, retryDelay: 0 })).toBeTruthy();
      const failed = await until('upload failed', () => uploadRow(upload.id), (r) => r.status !== 'queued', 60_000);
      expect(failed.status).toBe('failed');
      expect(failed.attempts).toBe(2);
      expect(failed.error.code).toBe('read_failed');
      expect(failed.error.message).toMatch(/could not be fetched from the file store/);
      expect(failed.error.message).toMatch(/Try again/);

      // The uploader sees it; the rider (who did not upload it) may not retry it; the uploader may.
      const carer = await world.as('carer');
      const shown = await carer.json('GET', `/api/uploads?clientId=${world.clientId}`);
      expect(shown.body.uploads.find((u: { id: string }) => u.id === upload.id)).toMatchObject({ status: 'failed', error: { code: 'read_failed' } });
      expect((await (await world.as('client')).json('POST', `/api/uploads/${upload.id}/reprocess`)).status).toBe(403);
      // The file is found again (restored from a backup, say): trying again reads it.
      await putObjectStream(`${upload.storage_key}-missing`, Readable.from([Buffer.from(content)]));
      const retried = await carer.json('POST', `/api/uploads/${upload.id}/reprocess`);
      expect(retried.status).toBe(202);
      expect(retried.body.status).toBe('queued');
      const after = await until('upload read on the retry', () => uploadRow(upload.id), (r) => r.status !== 'queued');
      expect(after.status).toBe('accepted');
    } finally {
      await stopAllProcesses();
      await q.close();
    }
  });
});

describe('the object store stopping', () => {
  it('during an upload: 503 storage_unavailable, nothing stored; jobs waiting meanwhile complete when it is back', { timeout: 120_000 }, async () => {
    const ports = drillPorts(5);
    const s3dir = mkdtempSync(path.join(os.tmpdir(), 'kinloop-s3-'));
    const q = await ownQueue({ S3_ENDPOINT: `http://127.0.0.1:${ports.s3}` });
    try {
      let s3proc = await startProcess(s3Args(ports.s3, s3dir), {}, /s3-fake ready/);
      await startProcess(appArgs, { ...q.env, PORT: String(ports.app) }, /kinloop app ready/);
      const http = await new Http(`http://127.0.0.1:${ports.app}`).signIn(world.users.carer.email, PASSWORD);

      // A file stored while the store is up waits in the queue (no worker yet).
      const waiting = await http.json('POST', '/api/uploads?wait=0', formFor(world.clientId, [{ name: 'waits.csv', content: rideCsv({ startedAt: '2026-04-22T09:00:00Z' }) }]));
      expect(waiting.status).toBe(202);
      const waitingId = waiting.body.files[0].uploadId;

      const name = `interrupted-${randomUUID()}.csv`;
      const boundary = `----kinloop${randomUUID()}`;
      const line = '1,active,40,20,60,60\n';
      const chunk = Buffer.from(line.repeat(Math.ceil((256 * 1024) / line.length)));
      let sent = 0;
      const body = new ReadableStream<Uint8Array>({
        async pull(controller) {
          if (sent === 0) {
            controller.enqueue(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="clientId"\r\n\r\n${world.clientId}\r\n--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="${name}"\r\nContent-Type: text/csv\r\n\r\ntime,phase,cadence,power,quad l,quad r\n`));
          } else if (sent < 16) {
            // Half-way through the file, the store goes away.
            if (sent === 8) await stopProcess(s3proc.child, 'SIGKILL');
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

      // The worker starts while the store is away: its reads fail and are retried, not given up.
      await startProcess(workerArgs, q.env, /kinloop worker ready/);
      const tried = await until('a failed read', () => uploadRow(waitingId), (r) => r.attempts >= 1, 30_000);
      expect(tried.status).toBe('queued');
      s3proc = await startProcess(s3Args(ports.s3, s3dir), {}, /s3-fake ready/);
      const done = await until('waiting upload read', () => uploadRow(waitingId), (r) => r.status !== 'queued', 60_000);
      expect(done.status).toBe('accepted');
    } finally {
      await stopAllProcesses();
      await q.close();
    }
  });
});
