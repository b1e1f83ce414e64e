import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { config } from '../config';

export interface CapturedEmail {
  id: string;
  receivedAt: string;
  from: string | null;
  to: string[];
  subject: string;
  text: string;
  html: string;
  headers: Record<string, string>;
}

/** The e-mails the local SMTP fake captured, newest first; null when mail goes to a real server. */
export async function readMailbox(limit = 100): Promise<CapturedEmail[] | null> {
  const dir = config().mailboxDir;
  if (!dir) return null;
  let names: string[];
  try {
    names = (await readdir(dir)).filter((n) => n.endsWith('.json'));
  } catch {
    return [];
  }
  names.sort().reverse();
  return Promise.all(names.slice(0, limit).map(async (n) => JSON.parse(await readFile(path.join(dir, n), 'utf8')) as CapturedEmail));
}
