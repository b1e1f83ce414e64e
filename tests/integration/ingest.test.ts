import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import { createHash, randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { config } from '../../src/lib/config';
import { closeDb } from '../../src/lib/db/knex';
import { s3 } from '../../src/lib/storage/s3';
import { formFor, rideCsv, uploadAndWait } from '../support/rides';
import { createWorld, type World } from '../support/world';

const fixture = (name: string) => readFileSync(path.resolve('fixtures/rides', name));
const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

let world: World;
beforeAll(async () => {
  world = await createWorld('ingest');
});
afterAll(closeDb);

async function objectsUnder(prefix: string): Promise<string[]> {
  const res = await s3().send(new ListObjectsV2Command({ Bucket: config().s3.bucket, Prefix: prefix }));
  return (res.Contents ?? []).map((o) => o.Key!);
}
const clientPrefix = () => `rides/${world.clinicId}/${world.clientId}/`;
const uploadCount = async () => Number((await world.knex('uploads').where({ client_id: world.clientId }).count('* as n'))[0].n);
const rideCount = async () => Number((await world.knex('rides').where({ client_id: world.clientId }).count('* as n'))[0].n);

describe('uploading ride files', () => {
  it('stores the file byte-identical and makes a session with the expected summary', async () => {
    const carer = await world.as('carer');
    const bytes = fixture('semicolon-decimal-comma.csv');
    const expected = JSON.parse(readFileSync(path.resolve('fixtures/rides/semicolon-decimal-comma.expected.json'), 'utf8'));
    const [result] = await uploadAndWait(carer, world.clientId, [{ name: 'semicolon.csv', content: bytes }], { fallbackStartedAt: '2026-02-01T08:00:00Z' });
    expect(result.status).toBe('accepted');

    const raw = await carer.request('GET', `/api/uploads/${result.uploadId}/raw`);
    expect(raw.status).toBe(200);
    const back = new Uint8Array(await raw.arrayBuffer());
    expect(back.length).toBe(bytes.length);
    expect(sha(back)).toBe(sha(bytes));
    expect(raw.headers.get('x-content-sha256')).toBe(sha(bytes));

    const session = await carer.json('GET', `/api/sessions/${result.sessionId}`);
    expect(session.status).toBe(200);
    for (const key of ['durationS', 'activeS', 'passiveS', 'cooldownS', 'meanPowerW', 'meanCadenceRpm', 'workKj', 'distanceM', 'samples', 'pulseWidthUs', 'frequencyHz']) {
      expect(session.body.summary[key], key).toBeCloseTo(expected[key], 3);
    }
    expect(session.body.summary.channels).toEqual(expected.channels);
    expect(session.body.series.samples).toBe(expected.samples);
  });

  it('recognises the same bytes again and does not parse or count them twice', async () => {
    const carer = await world.as('carer');
    const content = rideCsv({ startedAt: '2026-02-03T10:00:00Z' });
    const [first] = await uploadAndWait(carer, world.clientId, [{ name: 'a.csv', content }]);
    const rides = await rideCount();
    const [again] = await uploadAndWait(carer, world.clientId, [{ name: 'a-copy.csv', content }]);
    expect(first.status).toBe('accepted');
    expect(again.status).toBe('duplicate');
    expect(again.duplicateOf).toBe(first.sessionId);
    expect(await rideCount()).toBe(rides);
  });

  it('marks a different file starting within 2 minutes of a session as its duplicate, and one 3 minutes away as a new session', async () => {
    const carer = await world.as('carer');
    const [first] = await uploadAndWait(carer, world.clientId, [{ name: 'b.csv', content: rideCsv({ startedAt: '2026-02-05T10:00:00Z' }) }]);
    const [near] = await uploadAndWait(carer, world.clientId, [{ name: 'b2.csv', content: rideCsv({ startedAt: '2026-02-05T10:01:30Z', powerW: 31 }) }]);
    const [apart] = await uploadAndWait(carer, world.clientId, [{ name: 'b3.csv', content: rideCsv({ startedAt: '2026-02-05T10:03:00Z', powerW: 32 }) }]);
    expect(near.status).toBe('duplicate');
    expect(near.duplicateOf).toBe(first.sessionId);
    expect(apart.status).toBe('accepted');
    // The duplicate's file is kept all the same.
    const raw = await carer.request('GET', `/api/uploads/${near.uploadId}/raw`);
    expect(raw.status).toBe(200);
  });

  it('answers each file in order: accepted, rejected with the parser’s error and line, duplicate', async () => {
    const carer = await world.as('carer');
    const ok = rideCsv({ startedAt: '2026-02-07T09:00:00Z' });
    const results = await uploadAndWait(carer, world.clientId, [
      { name: 'ok.csv', content: ok },
      { name: 'bad.csv', content: fixture('refused-no-time-column.csv') },
      { name: 'copy.csv', content: ok },
    ]);
    const expectedError = JSON.parse(readFileSync(path.resolve('fixtures/rides/refused-no-time-column.expected.json'), 'utf8')).error;
    expect(results.map((r) => r.status)).toEqual(['accepted', 'rejected', 'duplicate']);
    expect(results[1].error!.code).toBe(expectedError.code);
    expect(results[1].error!.message).toEqual(expect.any(String));
    const listed = await carer.json('GET', `/api/uploads?clientId=${world.clientId}`);
    expect(listed.body.uploads.find((u: { id: string }) => u.id === results[1].uploadId).status).toBe('rejected');
  });

  it('uses the page’s fallback start time for a file that has none, and says so in the warnings', async () => {
    const carer = await world.as('carer');
    const content = rideCsv().replace(/^Start time: .*\n/m, '');
    const [r] = await uploadAndWait(carer, world.clientId, [{ name: 'nostart.csv', content }], { fallbackStartedAt: '2026-02-09T07:45:00+01:00' });
    const session = await carer.json('GET', `/api/sessions/${r.sessionId}`);
    expect(session.body.startedAt).toBe('2026-02-09T06:45:00.000Z');
    expect(session.body.startedAtSource).toBe('file_modified');
    expect(session.body.summary.warnings.join(' ')).toMatch(/last-modified/);
  });

  it('keeps a start the cycle dated in the future as written, and asks for the cycle’s clock to be checked', async () => {
    const carer = await world.as('carer');
    const startedAt = new Date(Date.now() + 3 * 86_400_000).toISOString();
    const [r] = await uploadAndWait(carer, world.clientId, [{ name: 'fast-clock.csv', content: rideCsv({ startedAt }) }]);
    expect(r.status).toBe('accepted');
    const session = await carer.json('GET', `/api/sessions/${r.sessionId}`);
    expect(session.body.startedAt).toBe(startedAt);
    expect(session.body.summary.warnings.join(' ')).toMatch(/after the file was uploaded: check the date and time set on the cycle/);
  });

  it('reprocessing replaces the session in place, without a second one', async () => {
    const carer = await world.as('carer');
    const therapist = await world.as('therapist');
    const [r] = await uploadAndWait(carer, world.clientId, [{ name: 'again.csv', content: rideCsv({ startedAt: '2026-02-11T09:00:00Z' }) }]);
    const before = await rideCount();
    const res = await therapist.json('POST', `/api/uploads/${r.uploadId}/reprocess`);
    expect(res.status).toBe(202);
    const deadline = Date.now() + 20_000;
    let upload = res.body;
    while (upload.status === 'queued' && Date.now() < deadline) {
      await new Promise((x) => setTimeout(x, 200));
      upload = (await therapist.json('GET', `/api/uploads/${r.uploadId}`)).body;
    }
    expect(upload.status).toBe('accepted');
    expect(upload.sessionId).toBe(r.sessionId);
    expect(await rideCount()).toBe(before);
  });
});

describe('limits: a clear 4xx and nothing stored', () => {
  it('refuses a file over 25 MB with 413 too_large, keeping neither the object nor a row', async () => {
    const carer = await world.as('carer');
    const objects = (await objectsUnder(clientPrefix())).length;
    const uploads = await uploadCount();
    const line = '1,active,40,20,60,60\n';
    const big = 'time,phase,cadence,power,quad l,quad r\n' + line.repeat(Math.ceil((25 * 1024 * 1024 + 10) / line.length));
    const small = rideCsv({ startedAt: '2026-02-13T09:00:00Z' });
    const res = await carer.request('POST', '/api/uploads', formFor(world.clientId, [{ name: 'small.csv', content: small }, { name: 'huge.csv', content: big }]));
    expect(res.status).toBe(413);
    const body = await res.json();
    expect(body.error.code).toBe('too_large');
    expect(body.error.message).toContain('huge.csv');
    expect(await uploadCount()).toBe(uploads);
    expect((await objectsUnder(clientPrefix())).length).toBe(objects);
  });

  it('refuses more than 50 files in one request', async () => {
    const carer = await world.as('carer');
    const uploads = await uploadCount();
    const files = Array.from({ length: 51 }, (_, i) => ({ name: `f${i}.csv`, content: `t,power\n${i},1\n` }));
    const res = await carer.request('POST', '/api/uploads', formFor(world.clientId, files));
    expect(res.status).toBe(413);
    expect((await res.json()).error.code).toBe('too_many_files');
    expect(await uploadCount()).toBe(uploads);
  });

  it('answers 404 for a client the user may not upload for, and stores nothing', async () => {
    const other = await world.as('otherTherapist');
    const uploads = await uploadCount();
    const res = await other.request('POST', '/api/uploads', formFor(world.clientId, [{ name: 'x.csv', content: rideCsv() }]));
    expect(res.status).toBe(404);
    expect(await uploadCount()).toBe(uploads);
    expect(await objectsUnder(`rides/${world.otherClinicId}/`)).toEqual([]);
  });

  it('asks for clientId before the files', async () => {
    const carer = await world.as('carer');
    const form = new FormData();
    form.append('files', new Blob([rideCsv()]), 'x.csv');
    form.append('clientId', world.clientId);
    const res = await carer.request('POST', '/api/uploads', form);
    expect(res.status).toBe(400);
    expect((await res.json()).error.message).toMatch(/clientId/);
  });
});

describe('parsing errors leave the file for later', () => {
  it('keeps a rejected file so that it can be reprocessed, byte-identical', async () => {
    const carer = await world.as('carer');
    const bytes = fixture('refused-no-header.csv');
    const [r] = await uploadAndWait(carer, world.clientId, [{ name: `r-${randomUUID()}.csv`, content: bytes }]);
    expect(r.status).toBe('rejected');
    const raw = await carer.request('GET', `/api/uploads/${r.uploadId}/raw`);
    expect(sha(new Uint8Array(await raw.arrayBuffer()))).toBe(sha(bytes));
  });
});
