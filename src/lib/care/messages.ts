// Messages between the clinic and the rider: one thread per client, between
// the clinic's staff, the client and their active carers. Kept in the record
// (never edited or deleted) and in the audit log. Each new message e-mails the
// others that a message is waiting, never its text: no clinical detail leaves
// Kinloop by e-mail. Opening the thread marks it read for the reader.
import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { config } from '../config';
import { scope, type ClientGrant, type Db } from '../data';
import type { ClientRow, FlagRow } from '../db/tables';
import { flagReason } from '../flags/reason';
import { FLAG_KIND_WORDS } from '../flags/words';
import { FALLBACK_LOCALE } from '../time/format';
import { clinicLocale } from '../time/locale';
import { badRequest } from '../http/errors';
import { enqueueEmail } from '../mail/outbox';
import { notificationEmail, type Recipient } from '../notifications/compose';
import { riderAndCarers, therapistsOf } from '../notifications/recipients';
import { paragraph } from '../validation/fields';

export const MAX_MESSAGE_CHARS = 4000;

export const messageInputSchema = z
  .object({
    body: paragraph(z.string().trim().min(1, 'Message: write something to send.').max(MAX_MESSAGE_CHARS, `Message: at most ${MAX_MESSAGE_CHARS} characters.`), 'Message'),
    /** Staff only: the triage flag the message is about; its reason is quoted. */
    flagId: z.string().uuid('Flag: not a flag id.').optional(),
  })
  .strict();

type Role = 'staff' | 'client' | 'carer';

/** The thread, newest first, with what the reader had not read; opening it marks it read. */
export async function readThread(ctx: RequestContext, clientId: string) {
  const client = await scope(ctx).client(clientId, 'read', 'messages.view');
  const rows = await client.db('messages as m').join('users as u', 'u.id', 'm.author_id').orderBy('m.created_at', 'desc').limit(200).select('m.*', 'u.name as author_name');
  const reads = await client.db('message_reads as r').join('users as u', 'u.id', 'r.user_id').select('r.user_id', 'r.read_up_to', 'u.name');
  // Who is staff is a fact about the thread's authors that a carer or the client cannot read from memberships themselves.
  const staffIds = await staffOf(client.system('the roles of a thread’s authors'), client);
  const mine = reads.find((r) => r.user_id === ctx.viewer.userId)?.read_up_to as Date | undefined;
  const roleOf = (userId: string): Role => (userId === client.row.user_id ? 'client' : staffIds.has(userId) ? 'staff' : 'carer');
  const messages = rows.map((m) => ({
    id: m.id as string,
    body: m.body as string,
    sentAt: (m.created_at as Date).toISOString(),
    author: { userId: m.author_id as string, name: m.author_name as string, role: roleOf(m.author_id), you: m.author_id === ctx.viewer.userId },
    flagQuote: (m.flag_quote as string | null) ?? null,
    unread: m.author_id !== ctx.viewer.userId && (!mine || mine < m.created_at),
    // Who else has opened the thread since it was sent.
    readBy: reads.filter((r) => r.user_id !== m.author_id && r.read_up_to >= m.created_at).map((r) => r.name as string),
  }));
  if (rows.length) await markRead(client, ctx.viewer.userId, rows[0].created_at);
  return { clientId: client.id, clientName: client.row.display_name, staff: client.managed, messages };
}

async function staffOf(db: Db, client: ClientGrant): Promise<Set<string>> {
  return new Set<string>(await db('memberships').where({ clinic_id: client.clinicId }).pluck('user_id'));
}

/** The reader's own position in the thread: it only moves forward. */
async function markRead(client: ClientGrant, userId: string, upTo: Date) {
  await client.transaction(async (tx) => {
    await tx.lock(`message_read:${client.id}:${userId}`);
    const at: { read_up_to: Date } | undefined = await tx.db('message_reads').where({ user_id: userId }).first('read_up_to');
    if (!at) await tx.db('message_reads').insert({ user_id: userId, read_up_to: upTo });
    else if (at.read_up_to < upTo) await tx.db('message_reads').where({ user_id: userId }).update({ read_up_to: upTo });
  });
}

/** What a flag quote says: its kind and reason, as triage shows them. */
export function flagQuote(flag: Pick<FlagRow, 'kind' | 'reason' | 'evidence'>, locale: string): string {
  return `${FLAG_KIND_WORDS[flag.kind as keyof typeof FLAG_KIND_WORDS] ?? flag.kind}: ${flagReason(flag, locale)}`;
}

/** The quote of one of the client's flags, for staff opening the thread from triage; null for anything else. */
export async function quoteOfFlag(ctx: RequestContext, clientId: string, flagId: string, locale: string): Promise<string | null> {
  const client = await scope(ctx).client(clientId, 'read', 'messages.view');
  if (!client.managed || !/^[0-9a-f-]{36}$/i.test(flagId)) return null;
  const flag = await client.db<FlagRow>('flags').where({ id: flagId }).first();
  return flag ? flagQuote(flag, locale) : null;
}

/** The clients among `ids` the caller may read, by name: a carer of several chooses one thread. */
export async function threadChoices(ctx: RequestContext, ids: string[]) {
  return ids.length ? scope(ctx).clients().whereIn('id', ids).orderBy('display_name').select('id', 'display_name') : [];
}

export async function sendMessage(ctx: RequestContext, clientId: string, input: z.infer<typeof messageInputSchema>) {
  const client = await scope(ctx).client(clientId, 'contribute', 'message.send');
  let quote: string | null = null;
  if (input.flagId) {
    // Flags are the clinic's: only its staff quote one (the grant reads no flags for anyone else).
    const flag = client.managed ? await client.db<FlagRow>('flags').where({ id: input.flagId }).first() : undefined;
    if (!flag) throw badRequest('That flag is not one of this client’s flags.', { fields: [{ path: 'flagId', message: 'Choose a flag of this client.' }] });
    const clinic = await client.db('clinics').where({ id: client.clinicId }).first('locale', 'time_zone');
    quote = flagQuote(flag, clinic ? clinicLocale(clinic) : FALLBACK_LOCALE);
  }
  const row = await client.transaction(async (tx) => {
    const [created] = await tx.db('messages').insert({ author_id: ctx.viewer.userId, body: input.body, flag_id: input.flagId ?? null, flag_quote: quote }).returning('*');
    await markRead(tx, ctx.viewer.userId, created.created_at);
    await tx.audit({ action: 'message.send', recordType: 'message', recordId: created.id, detail: { flagId: input.flagId ?? null, chars: input.body.length } });
    await noticeOthers(tx.system('notices of a new message to the others on the thread'), client.row, created.id, ctx.viewer.userId);
    return created;
  });
  const role: Role = client.row.user_id === ctx.viewer.userId ? 'client' : client.managed ? 'staff' : 'carer';
  return {
    id: row.id as string,
    body: row.body as string,
    sentAt: (row.created_at as Date).toISOString(),
    author: { userId: ctx.viewer.userId, name: ctx.viewer.name, role, you: true },
    flagQuote: quote,
    unread: false,
    readBy: [] as string[],
  };
}

/**
 * Everyone else on the thread who wants message notices: the client's
 * therapists (as urgent alerts reach them), the rider and active carers. The
 * e-mail says only that a message is waiting and where; queued in the same
 * transaction as the message, so neither exists without the other.
 */
async function noticeOthers(trx: Db, client: ClientRow, messageId: string, authorId: string) {
  const recipients = new Map<string, { to: Recipient }>();
  for (const to of await therapistsOf(trx, client, 'messages')) recipients.set(to.userId, { to });
  for (const to of await riderAndCarers(trx, client, 'messages')) if (!recipients.has(to.userId)) recipients.set(to.userId, { to });
  recipients.delete(authorId);
  for (const { to } of recipients.values()) {
    const url = `${config().publicUrl}/messages?clientId=${client.id}`;
    await enqueueEmail(
      trx,
      notificationEmail(to, 'messages', {
        kind: 'message_notice',
        subject: 'A message is waiting for you in Kinloop',
        paragraphs: ['There is a new message for you in Kinloop. For privacy it is not included in this e-mail: sign in to read it.'],
        action: { label: 'Read the message', url },
        dedupeKey: `message:${messageId}:${to.userId}`,
      }),
    );
  }
}
