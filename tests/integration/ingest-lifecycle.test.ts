// What happens to an upload after it is stored: a copy of a file that is
// still waiting to be read, one stored object for the same bytes, a file
// read again after its import profile changed, and the sweeper that looks
// after uploads whose job went missing or that were tried too often.
import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import { createHash, randomUUID } from 'node:crypto';
import { Readable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { config } from '../../src/lib/config';
import { closeDb } from '../../src/lib/db/knex';
import { filesInFlight, resendStaleUploads, sweepOrphanObjects } from '../../src/lib/ingest/sweep';
import { putObjectStream, s3 } from '../../src/lib/storage/s3';
import { until } from '../support/processes';
import { formFor, rideCsv, uploadAndWait } from '../support/rides';
import { createWorld, type World } from '../support/world';

let world: World;
beforeAll(async () => {
  world = await createWorld('lifecycle');
});
afterAll(closeDb);

const sha = (s: string) => createHash('sha256').update(s).digest('hex');

async function objectsUnder(prefix: string): Promise<string[]> {
  const res = await s3().send(new ListObjectsV2Command({ Bucket: config().s3.bucket, Prefix: prefix }));
  return (res.Contents ?? []).map((o) => o.Key!);
}

async function uploadRow(id: string) {
  return world.knex('uploads').where({ id }).first();
}

describe('the same bytes sent again', () => {
  it('while the first copy is still waiting to be read: the copy waits for it and then takes its outcome', async () => {
    const carer = await world.as('carer');
    const content = rideCsv({ startedAt: '2026-03-10T09:00:00Z' });
    // Hold the client's placement lock, as a long parse would, so the first copy stays queued.
    const holder = await world.knex.client.acquireConnection();
    try {
      await holder.query('SELECT pg_advisory_lock(hashtextextended($1, 0))', [`rides:${world.clientId}`]);
      const first = await carer.json('POST', '/api/uploads?wait=0', formFor(world.clientId, [{ name: 'first.csv', content }]));
      const again = await carer.json('POST', '/api/uploads?wait=0', formFor(world.clientId, [{ name: 'again.csv', content }]));
      expect(first.body.files[0].status).toBe('queued');
      expect(again.body.files[0].status).toBe('queued');
      expect((await uploadRow(again.body.files[0].uploadId)).duplicate_of_upload_id).toBe(first.body.files[0].uploadId);
      await holder.query('SELECT pg_advisory_unlock(hashtextextended($1, 0))', [`rides:${world.clientId}`]);

      const settledFirst = await until('first copy', () => uploadRow(first.body.files[0].uploadId), (r) => r.status !== 'queued');
      const settledAgain = await until('second copy', () => uploadRow(again.body.files[0].uploadId), (r) => r.status !== 'queued');
      expect(settledFirst.status).toBe('accepted');
      expect(settledAgain.status).toBe('duplicate');
      expect(settledAgain.duplicate_of_ride_id).toBe(settledFirst.ride_id);
      expect(await world.knex('rides').where({ client_id: world.clientId, started_at: new Date('2026-03-10T09:00:00Z') }).count('* as n').first()).toEqual({ n: '1' });
    } finally {
      await holder.query('SELECT pg_advisory_unlock_all()');
      world.knex.client.releaseConnection(holder);
    }
  });

  it('is stored once: both uploads name one object, and each downloads the bytes', async () => {
    const carer = await world.as('carer');
    const content = rideCsv({ startedAt: '2026-03-12T09:00:00Z' });
    const prefix = `rides/${world.clinicId}/${world.clientId}/`;
    const before = new Set(await objectsUnder(prefix));
    const [a] = await uploadAndWait(carer, world.clientId, [{ name: 'once.csv', content }]);
    const [b] = await uploadAndWait(carer, world.clientId, [{ name: 'once-again.csv', content }]);
    const added = (await objectsUnder(prefix)).filter((k) => !before.has(k));
    expect(added).toHaveLength(1);
    expect((await uploadRow(a.uploadId)).storage_key).toBe(added[0]);
    expect((await uploadRow(b.uploadId)).storage_key).toBe(added[0]);
    for (const id of [a.uploadId, b.uploadId]) {
      const raw = await carer.request('GET', `/api/uploads/${id}/raw`);
      expect(sha(await raw.text())).toBe(sha(content));
    }
  });
});

describe('reprocessing', () => {
  const rows = (t0: number) => Array.from({ length: 60 }, (_, t) => `${t0 + t};22`).join('\n');
  const file = (start: string) => `Start time: ${start}\nZeit;Leistung\n${rows(0)}\n`;

  it('an accepted file that its import profile no longer reads loses its session, keeps its bytes, and its copies follow', async () => {
    const carer = await world.as('carer');
    const admin = await world.as('admin');
    const therapist = await world.as('therapist');
    const profile = await admin.json('POST', '/api/import-profiles', { name: `Zeit ${randomUUID().slice(0, 6)}`, columns: { Zeit: { field: 'time' }, Leistung: { field: 'power', unit: 'W' } } });
    expect(profile.status).toBe(201);
    const content = file('2026-03-14T09:00:00Z');
    const [read] = await uploadAndWait(carer, world.clientId, [{ name: 'zeit.csv', content }], { importProfileId: profile.body.id });
    const [copy] = await uploadAndWait(carer, world.clientId, [{ name: 'zeit-copy.csv', content }], { importProfileId: profile.body.id });
    expect(read.status).toBe('accepted');
    expect(copy.status).toBe('duplicate');

    // The clinic changes the profile; the file no longer has a time column under it.
    const changed = await admin.json('PUT', `/api/import-profiles/${profile.body.id}`, { name: profile.body.name, columns: { Leistung: { field: 'power', unit: 'W' } } });
    expect(changed.status).toBe(200);
    expect((await therapist.json('POST', `/api/uploads/${read.uploadId}/reprocess`)).status).toBe(202);

    const after = await until('reprocessed upload', () => uploadRow(read.uploadId), (r) => r.status !== 'queued');
    expect(after.status).toBe('rejected');
    expect(after.error.code).toBe('no_time_column');
    expect(after.ride_id).toBeNull();
    expect((await carer.json('GET', `/api/sessions/${read.sessionId}`)).status).toBe(404);
    const raw = await carer.request('GET', `/api/uploads/${read.uploadId}/raw`);
    expect(await raw.text()).toBe(content);
    const follower = await uploadRow(copy.uploadId);
    expect(follower.status).toBe('rejected');
    expect(follower.error.code).toBe('no_time_column');
  });
});

describe('the stale-upload sweeper', () => {
  it('sends a lost job again, fails an upload tried seven times (and the copy waiting for it), and leaves a recent one alone', async () => {
    const now = Date.now();
    const minutesAgo = (m: number) => new Date(now - m * 60_000);
    const content = rideCsv({ startedAt: '2026-03-16T09:00:00Z' });
    const key = `rides/${world.clinicId}/${world.clientId}/${randomUUID()}`;
    await putObjectStream(key, Readable.from([Buffer.from(content)]));
    const base = { client_id: world.clientId, clinic_id: world.clinicId, uploaded_by: world.users.carer.id, byte_size: content.length, storage_key: key, status: 'queued' };
    const [lost] = await world.knex('uploads').insert({ ...base, original_name: 'lost.csv', sha256: sha(content), enqueued_at: minutesAgo(11), attempts: 0 }).returning('id');
    const [tired] = await world.knex('uploads').insert({ ...base, original_name: 'tired.csv', sha256: randomUUID(), enqueued_at: minutesAgo(11), attempts: 7 }).returning('id');
    const [waiting] = await world.knex('uploads').insert({ ...base, original_name: 'tired-copy.csv', sha256: randomUUID(), enqueued_at: minutesAgo(11), duplicate_of_upload_id: tired.id }).returning('id');
    const [recent] = await world.knex('uploads').insert({ ...base, original_name: 'recent.csv', sha256: randomUUID(), enqueued_at: minutesAgo(5), attempts: 1 }).returning('id');

    await resendStaleUploads(world.knex);

    const failed = await uploadRow(tired.id);
    expect(failed.status).toBe('failed');
    expect(failed.error.code).toBe('read_failed');
    expect(failed.error.message).toMatch(/7 times/);
    expect((await uploadRow(waiting.id)).status).toBe('failed');
    const untouched = await uploadRow(recent.id);
    expect(untouched.status).toBe('queued');
    expect(untouched.enqueued_at).toEqual(minutesAgo(5));
    // The lost one's job went to the running worker, which reads it.
    const resent = await until('lost upload', () => uploadRow(lost.id), (r) => r.status !== 'queued');
    expect(resent.status).toBe('accepted');
    await world.knex('uploads').where({ id: recent.id }).update({ status: 'failed' });
  });

  it('does not let a failed or stuck upload hold back flag judgement; a file being read does', async () => {
    const [client] = await world.knex('clients').insert({ clinic_id: world.clinicId, display_name: 'Flag Wait', time_zone: 'Europe/London' }).returning('id');
    const base = { client_id: client.id, clinic_id: world.clinicId, uploaded_by: world.users.therapist.id, byte_size: 1, original_name: 'x.csv' };
    const row = (status: string, minutes: number) => ({ ...base, sha256: randomUUID(), storage_key: randomUUID(), status, enqueued_at: new Date(Date.now() - minutes * 60_000) });
    await world.knex('uploads').insert([row('failed', 1), row('queued', 25)]);
    expect(await filesInFlight(world.knex, client.id)).toBe(false);
    await world.knex('uploads').insert(row('queued', 1));
    expect(await filesInFlight(world.knex, client.id)).toBe(true);
  });
});

describe('the orphan object sweep', () => {
  it('deletes an object no upload names once it is an hour old, and keeps named and younger ones', async () => {
    const prefix = `rides/${world.clinicId}/${world.otherClientId}/`;
    const orphan = `${prefix}${randomUUID()}`;
    const named = `${prefix}${randomUUID()}`;
    for (const key of [orphan, named]) await putObjectStream(key, Readable.from([Buffer.from('time,power\n0,1\n')]));
    await world.knex('uploads').insert({ client_id: world.otherClientId, clinic_id: world.clinicId, uploaded_by: world.users.therapist.id, original_name: 'named.csv', byte_size: 16, sha256: randomUUID(), storage_key: named, status: 'rejected' });

    // Just stored: too young to tell from an upload still in progress.
    expect(await sweepOrphanObjects(world.knex, { prefix })).toEqual([]);
    expect(await sweepOrphanObjects(world.knex, { prefix, now: new Date(Date.now() + 61 * 60_000) })).toEqual([orphan]);
    expect((await objectsUnder(prefix)).sort()).toEqual([named]);
  });
});

describe('file names', () => {
  it('are read as UTF-8 and sent back with an ASCII filename and the exact name in filename*', async () => {
    const carer = await world.as('carer');
    const name = 'Fahrt Müller 日本.csv';
    const [r] = await uploadAndWait(carer, world.clientId, [{ name, content: rideCsv({ startedAt: '2026-03-20T09:00:00Z' }) }]);
    expect((await uploadRow(r.uploadId)).original_name).toBe(name);
    const raw = await carer.request('GET', `/api/uploads/${r.uploadId}/raw`);
    expect(raw.status).toBe(200);
    // ü = C3 BC, 日 = E6 97 A5, 本 = E6 9C AC (source: the Unicode code charts, encoded by hand).
    expect(raw.headers.get('content-disposition')).toBe(`attachment; filename="Fahrt Muller __.csv"; filename*=UTF-8''Fahrt%20M%C3%BCller%20%E6%97%A5%E6%9C%AC.csv`);
  });

  it('lose control characters and bidirectional overrides, even a NUL sent in an RFC 5987 name, and nothing is left in storage', async () => {
    const carer = await world.as('carer');
    const boundary = `----names${randomUUID()}`;
    const content = rideCsv({ startedAt: '2026-03-22T09:00:00Z' });
    const body =
      `--${boundary}\r\nContent-Disposition: form-data; name="clientId"\r\n\r\n${world.clientId}\r\n` +
      `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename*=UTF-8''ride%00%E2%80%AEvsc.csv\r\nContent-Type: text/csv\r\n\r\n${content}\r\n--${boundary}--\r\n`;
    const res = await carer.request('POST', '/api/uploads', body, { 'content-type': `multipart/form-data; boundary=${boundary}` });
    expect(res.status).toBe(200);
    const [file] = (await res.json()).files;
    expect(file.name).toBe('ridevsc.csv');
    expect((await uploadRow(file.uploadId)).original_name).toBe('ridevsc.csv');
  });

  it('a refusal after the file was stored (an unreadable fallbackStartedAt, another clinic’s import profile) leaves no object', async () => {
    const carer = await world.as('carer');
    const prefix = `rides/${world.clinicId}/${world.clientId}/`;
    const [foreign] = await world.knex('import_profiles').insert({ clinic_id: world.otherClinicId, name: 'elsewhere', mapping: JSON.stringify({ name: 'x', columns: {} }) }).returning('id');
    const before = (await objectsUnder(prefix)).sort();
    const file = [{ name: 'late-fields.csv', content: rideCsv({ startedAt: '2026-03-24T09:00:00Z' }) }];
    for (const extra of [{ fallbackStartedAt: 'yesterday' }, { importProfileId: foreign.id }]) {
      // The field comes after the file, so it is only read once the file is stored.
      const form = formFor(world.clientId, file);
      for (const [k, v] of Object.entries(extra)) form.append(k, v);
      const res = await carer.request('POST', '/api/uploads', form);
      expect(res.status).toBe(400);
    }
    expect((await objectsUnder(prefix)).sort()).toEqual(before);
  });
});
