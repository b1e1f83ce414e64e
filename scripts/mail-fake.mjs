// A local SMTP server that accepts every message and keeps it as JSON in a
// folder, so that development and tests can read what Kinloop sent.
//   node scripts/mail-fake.mjs --port 2525 --dir .data/mailbox
import { randomUUID } from 'node:crypto';
import { chmodSync, mkdirSync, readdirSync, renameSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

/** What an earlier version wrote world-readable becomes this user's alone: folders 0700, files 0600. */
function closeTree(dir) {
  chmodSync(dir, 0o700);
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name);
    if (entry.isDirectory()) closeTree(p);
    else if (entry.isFile() && statSync(p).mode & 0o077) chmodSync(p, 0o600);
  }
}

const { values } = parseArgs({
  options: {
    port: { type: 'string', default: '2525' },
    address: { type: 'string', default: '127.0.0.1' },
    dir: { type: 'string' },
  },
});
if (!values.dir) {
  console.error('usage: mail-fake.mjs --dir DIR [--port N]');
  process.exit(64);
}
// Captured mail holds sign-in links: only this user may read it (folders 0700, files 0600).
process.umask(0o077);
mkdirSync(values.dir, { recursive: true, mode: 0o700 });
closeTree(values.dir);

const addresses = (field) => (field ? [field].flat().flatMap((a) => a.value.map((v) => v.address)) : []);

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  logger: false,
  onData(stream, session, callback) {
    simpleParser(stream)
      .then((mail) => {
        const id = `${Date.now()}-${randomUUID()}`;
        const record = {
          id,
          receivedAt: new Date().toISOString(),
          envelopeFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
          envelopeTo: session.envelope.rcptTo.map((r) => r.address),
          from: addresses(mail.from)[0] ?? null,
          to: addresses(mail.to),
          subject: mail.subject ?? '',
          text: mail.text ?? '',
          html: typeof mail.html === 'string' ? mail.html : '',
          // Header lines as sent (parsed header values can be objects).
          headers: Object.fromEntries(mail.headerLines.map((h) => [h.key, h.line.slice(h.line.indexOf(':') + 1).trim()])),
        };
        // Write then rename, so that a reader never sees half a message.
        const tmp = path.join(values.dir, `.${id}.tmp`);
        writeFileSync(tmp, JSON.stringify(record, null, 2), { mode: 0o600 });
        renameSync(tmp, path.join(values.dir, `${id}.json`));
        callback();
      })
      .catch((err) => callback(err));
  },
});
server.on('error', (err) => console.error(`mail-fake: ${err.message}`));
server.listen(Number(values.port), values.address, () => {
  console.log(`mail-fake ready on smtp://${values.address}:${values.port} dir=${values.dir}`);
});

const stop = () => server.close(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
