// The outbox delays mail while the mail server is away and loses none, and
// never sends a message twice — even with two workers. It runs against a
// database and SMTP fake of its own, so the shared test stack is not disturbed.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readdirSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import knexFactory from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = process.env.KINLOOP_ROOT ?? process.cwd();
const children: ChildProcess[] = [];
const mainUrl = new URL(process.env.DATABASE_URL!);
const dbName = `kinloop_outbox_${process.pid}`;
const dbUrl = (() => {
  const u = new URL(mainUrl.toString());
  u.pathname = `/${dbName}`;
  return u.toString();
})();
const smtpPort = Number(process.env.KINLOOP_SMTP_PORT ?? 2535) + 7;
const mailDir = mkdtempSync(path.join(os.tmpdir(), 'kinloop-outbox-'));

function start(args: string[], env: NodeJS.ProcessEnv, ready: RegExp, cmd = process.execPath): Promise<ChildProcess> {
  const child = spawn(cmd, args, { cwd: root, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  children.push(child);
  let out = '';
  return new Promise((resolve, reject) => {
    const onData = (d: Buffer) => {
      out += d.toString();
      if (ready.test(out)) resolve(child);
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    child.on('exit', (code) => (ready.test(out) ? undefined : reject(new Error(`${args.join(' ')} exited ${code}: ${out}`))));
  });
}
const stop = (c: ChildProcess) => new Promise<void>((r) => (c.exitCode !== null || c.signalCode !== null ? r() : (c.once('exit', () => r()), c.kill('SIGKILL'))));
const startSmtp = () => start(['scripts/mail-fake.mjs', '--port', String(smtpPort), '--dir', mailDir], {}, /mail-fake ready/);
const unsent = async () => Number((await knex('outbox_emails').whereNull('sent_at').count<{ n: string }[]>('* as n'))[0].n);
const failed = async () => Number((await knex('outbox_emails').whereNotNull('last_error').count<{ n: string }[]>('* as n'))[0].n);
const received = () => readdirSync(mailDir).filter((f) => f.endsWith('.json')).length;

let admin: ReturnType<typeof knexFactory>;
let knex: ReturnType<typeof knexFactory>;
beforeAll(async () => {
  admin = knexFactory({ client: 'pg', connection: mainUrl.toString() });
  await admin.raw(`CREATE DATABASE ${dbName}`);
  knex = knexFactory({ client: 'pg', connection: dbUrl });
  // Migrations are TypeScript; Knex loads them with require, so they run under tsx.
  await new Promise<void>((resolve, reject) => {
    const m = spawn(path.join(root, 'node_modules', '.bin', 'tsx'), ['scripts/db.ts', 'migrate'], { cwd: root, env: { ...process.env, DATABASE_URL: dbUrl }, stdio: 'inherit' });
    m.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`migrations exited ${code}`))));
  });
}, 120_000);
afterAll(async () => {
  await Promise.all(children.map(stop));
  await knex?.destroy();
  await admin?.raw(`DROP DATABASE IF EXISTS ${dbName} WITH (FORCE)`);
  await admin?.destroy();
});

describe('outbox', () => {
  it('retries after the mail server was down and comes back, and sends each message exactly once with two workers', async () => {
    const workerEnv = { DATABASE_URL: dbUrl, SMTP_URL: `smtp://127.0.0.1:${smtpPort}`, KINLOOP_QUEUE_SCHEMA: 'pgboss', KINLOOP_OUTBOX_RETRY_MS: '500' };
    // node with tsx's loader: one process per worker, so that stopping it stops it.
    const worker = ['--import', 'tsx', 'src/worker.ts'];
    await Promise.all([start(worker, workerEnv, /kinloop worker ready/), start(worker, workerEnv, /kinloop worker ready/)]);
    const messages = Array.from({ length: 12 }, (_, i) => ({ kind: 'test', to_address: `person${i}@example.test`, subject: `Message ${i}`, text_body: `Body ${i}`, html_body: `<p>Body ${i}</p>` }));
    await knex('outbox_emails').insert(messages);

    // No mail server yet: attempts fail and are kept for later.
    const until = Date.now() + 20_000;
    while (Date.now() < until && (await failed()) === 0) await new Promise((r) => setTimeout(r, 200));
    expect(await unsent()).toBe(12);

    const smtp = await startSmtp();
    // The fake writes a message to disk before it answers the worker, and the
    // worker marks the row sent only after that answer: wait for both.
    const deadline = Date.now() + 40_000;
    while (Date.now() < deadline && (received() < 12 || (await unsent()) > 0)) await new Promise((r) => setTimeout(r, 250));
    expect(await unsent()).toBe(0);
    expect(received()).toBe(12);

    // Stopped again and restarted: new mail waits, then goes, old mail is not resent.
    await stop(smtp);
    await knex('outbox_emails').insert({ kind: 'test', to_address: 'late@example.test', subject: 'Late', text_body: 'Late', html_body: '<p>Late</p>' });
    const lateFailed = async () => Boolean(await knex('outbox_emails').where({ to_address: 'late@example.test' }).whereNotNull('last_error').first('id'));
    const tried = Date.now() + 20_000;
    while (Date.now() < tried && !(await lateFailed())) await new Promise((r) => setTimeout(r, 200));
    expect(await lateFailed()).toBe(true);
    await startSmtp();
    // Once every row is marked sent no worker can send it again (a row is
    // marked in the transaction that sent it), so the count is then final.
    const later = Date.now() + 40_000;
    while (Date.now() < later && (received() < 13 || (await unsent()) > 0)) await new Promise((r) => setTimeout(r, 250));
    expect(await unsent()).toBe(0);
    expect(received()).toBe(13);
  });
});
