import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import type { RequestContext } from '../auth/context';
import { hashToken } from '../auth/tokens';
import { scope } from '../data';
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

// How far back one look goes: the newest files are read in batches until
// enough messages for this admin are found or this many were read.
const SCAN_LIMIT = 2000;
const BATCH = 100;

const INVITE_LINK = /\/invite\/([A-Za-z0-9_-]{20,200})/g;

/**
 * Whose a message is: an invitation belongs to the clinic that sent it (its
 * link names the invitation); any other message to the people it is addressed
 * to, and only when every one of them belongs to the admin's clinics alone.
 */
async function visibleTo(ctx: RequestContext, clinics: string[], people: Set<string>, messages: CapturedEmail[]): Promise<CapturedEmail[]> {
  const tokens = new Map<CapturedEmail, string[]>();
  for (const m of messages) tokens.set(m, [...`${m.text}\n${m.html}`.matchAll(INVITE_LINK)].map((x) => hashToken(x[1])));
  const hashes = [...new Set([...tokens.values()].flat())];
  const invitationClinic = new Map<string, string>(
    hashes.length ? (await scope(ctx).invitations().whereIn('token_hash', hashes).select('token_hash', 'clinic_id')).map((r) => [r.token_hash, r.clinic_id]) : [],
  );
  return messages.filter((m) => {
    const links = tokens.get(m)!;
    if (links.length) return links.every((h) => clinics.includes(invitationClinic.get(h) ?? ''));
    return m.to.length > 0 && m.to.every((to) => people.has(to.toLowerCase()));
  });
}

/**
 * The e-mails the local SMTP fake captured that this admin may read, newest
 * first; null when mail goes to a real server. Only admins read it, and only
 * what was sent to their own clinics' people: a reset or invitation link of
 * another clinic would open that clinic's records.
 */
export async function readMailbox(ctx: RequestContext, limit = 100): Promise<CapturedEmail[] | null> {
  const { clinics, addresses: people } = await scope(ctx).adminsPeople();
  const dir = config().mailboxDir;
  if (!dir) return null;
  let names: string[];
  try {
    names = (await readdir(dir)).filter((n) => n.endsWith('.json'));
  } catch {
    return [];
  }
  names.sort().reverse();
  const shown: CapturedEmail[] = [];
  for (let at = 0; at < Math.min(names.length, SCAN_LIMIT) && shown.length < limit; at += BATCH) {
    const batch = await Promise.all(
      names.slice(at, at + BATCH).map(async (n) => {
        try {
          return JSON.parse(await readFile(path.join(dir, n), 'utf8')) as CapturedEmail;
        } catch {
          return null;
        }
      }),
    );
    shown.push(...(await visibleTo(ctx, clinics, people, batch.filter((m): m is CapturedEmail => m !== null))));
  }
  return shown.slice(0, limit);
}
