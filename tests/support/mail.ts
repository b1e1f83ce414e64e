import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import type { CapturedEmail } from '../../src/lib/dev/mailbox';

const dir = () => {
  const d = process.env.KINLOOP_MAILBOX_DIR;
  if (!d) throw new Error('KINLOOP_MAILBOX_DIR is not set: run the tests with npm test');
  return d;
};

export async function allMail(): Promise<CapturedEmail[]> {
  const names = (await readdir(dir())).filter((n) => n.endsWith('.json')).sort();
  return Promise.all(names.map(async (n) => JSON.parse(await readFile(path.join(dir(), n), 'utf8'))));
}

/** Waits for the e-mails to `to` that match, as the SMTP fake captured them. */
export async function waitForMail(to: string, match: (m: CapturedEmail) => boolean = () => true, timeoutMs = 20_000): Promise<CapturedEmail> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const found = (await allMail()).filter((m) => m.to.includes(to.toLowerCase()) && match(m));
    if (found.length) return found[found.length - 1];
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`no e-mail to ${to} arrived within ${timeoutMs / 1000} s`);
}

export function linkIn(mail: CapturedEmail, pathPrefix: string): string {
  const m = mail.text.match(new RegExp(`https?://[^\\s]+${pathPrefix}[^\\s]+`));
  if (!m) throw new Error(`no ${pathPrefix} link in e-mail "${mail.subject}"`);
  return m[0];
}
