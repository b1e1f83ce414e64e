// Request bodies are limited while they are read: a body over its limit is
// answered 413 as soon as the limit is passed, whatever the transfer encoding,
// and the rest of it is never read. The client below keeps sending until the
// answer arrives, and counts what it managed to send by then.
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '../../src/lib/db/knex';
import { baseUrl } from '../support/browser';
import { createWorld, type World } from '../support/world';

let world: World;
beforeAll(async () => {
  world = await createWorld('limits');
});
afterAll(closeDb);

const MiB = 1024 * 1024;

/** Sends `head` then `filler` repeatedly, chunked, until the answer comes or `max` bytes are sent. */
function sendUntilAnswered(path: string, headers: Record<string, string>, head: Buffer, filler: Buffer, max: number) {
  const url = new URL(path, baseUrl());
  return new Promise<{ status: number; body: string; sentBeforeAnswer: number }>((resolve, reject) => {
    let sent = 0;
    let answered = false;
    const req = http.request(url, { method: 'POST', headers: { ...headers, 'transfer-encoding': 'chunked', origin: url.origin } });
    req.on('error', (err) => (answered ? undefined : reject(err)));
    req.on('response', (res) => {
      answered = true;
      const at = sent;
      let body = '';
      res.setEncoding('utf8');
      res.on('data', (d) => (body += d));
      res.on('end', () => {
        req.destroy();
        resolve({ status: res.statusCode!, body, sentBeforeAnswer: at });
      });
    });
    const write = async () => {
      req.write(head);
      sent += head.length;
      while (!answered && sent < max) {
        const more = req.write(filler);
        sent += filler.length;
        if (!more) await new Promise((r) => (answered ? r(null) : req.once('drain', r)));
        if (req.destroyed) return;
      }
      if (!answered) req.end();
    };
    void write();
  });
}

describe('request bodies are limited while they are read', () => {
  it('a chunked JSON body stops at 256 KB with 413, without signing in', { timeout: 60_000 }, async () => {
    const r = await sendUntilAnswered('/api/auth/sign-in', { 'content-type': 'application/json' }, Buffer.from('{"email":"a@b.test","password":"'), Buffer.alloc(64 * 1024, 'x'), 300 * MiB);
    expect(r.status).toBe(413);
    expect(JSON.parse(r.body).error.code).toBe('too_large');
    // The server stopped reading: what the client got out before the answer is what the sockets buffer, not the 300 MiB.
    expect(r.sentBeforeAnswer).toBeLessThan(16 * MiB);
  });

  it('a chunked upload stops at 25 MiB and 1 byte of a file with 413 too_large, and stores nothing', { timeout: 90_000 }, async () => {
    const carer = await world.as('carer');
    const uploads = async () => Number((await world.knex('uploads').where({ client_id: world.clientId }).count('* as n'))[0].n);
    const before = await uploads();
    const boundary = '----limits';
    const head = Buffer.from(
      `--${boundary}\r\nContent-Disposition: form-data; name="clientId"\r\n\r\n${world.clientId}\r\n--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="endless.csv"\r\nContent-Type: text/csv\r\n\r\ntime,power\n`,
    );
    const line = '1,20\n';
    const filler = Buffer.from(line.repeat(Math.ceil((64 * 1024) / line.length)));
    const r = await sendUntilAnswered('/api/uploads', { 'content-type': `multipart/form-data; boundary=${boundary}`, cookie: carer.cookie!, 'x-forwarded-for': carer.address }, head, filler, 200 * MiB);
    expect(r.status).toBe(413);
    const error = JSON.parse(r.body).error;
    expect(error.code).toBe('too_large');
    expect(error.message).toContain('endless.csv');
    expect(r.sentBeforeAnswer).toBeGreaterThan(25 * MiB);
    expect(r.sentBeforeAnswer).toBeLessThan(40 * MiB);
    expect(await uploads()).toBe(before);
    expect((await fetch(`${baseUrl()}/api/health`)).status).toBe(200);
  });

  it('a form post to the sign-in page over 16 KB is refused with 413', async () => {
    const res = await fetch(`${baseUrl()}/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded', origin: new URL(baseUrl()).origin },
      body: `email=a%40b.test&password=${'x'.repeat(20_000)}`,
    });
    expect(res.status).toBe(413);
  });
});
