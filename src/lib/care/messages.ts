// Messages between the clinic and the rider: one thread per client, between
// the clinic's staff, the client and their active carers. Kept in the record
// (never edited or deleted) and in the audit log. Each new message e-mails the
// others that a message is waiting, never its text: no clinical detail leaves
// Kinloop by e-mail. Opening the thread marks it read for the reader.
import type { Knex } from 'knex';
import { z } from 'zod';
import { accessClient, canManageClient } from '../auth/access';
import { auditAs, type RequestContext } from '../auth/context';
import { config } from '../config';
import type { ClientRow, FlagRow } from '../db/tables';
import { FLAG_KIND_WORDS } from '../flags/words';
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

async function participantRole(knex: Knex, client: ClientRow, userId: string): Promise<Role> {
  if (client.user_id === userId) return 'client';
  const staff = await knex('memberships').where({ user_id: userId, clinic_id: client.clinic_id }).first('id');
  return staff ? 'staff' : 'carer';
}

/** The thread, newest first, with what the reader had not read; opening it marks it read. */
export async function readThread(ctx: RequestContext, clientId: string) {
  const client = await accessClient(ctx, clientId, 'read', 'messages.view');
  const rows = await ctx.knex('messages as m').join('users as u', 'u.id', 'm.author_id').where('m.client_id', client.id).orderBy('m.created_at', 'desc').limit(200).select('m.*', 'u.name as author_name');
  const reads = await ctx.knex('message_reads as r').join('users as u', 'u.id', 'r.user_id').where('r.client_id', client.id).select('r.user_id', 'r.read_up_to', 'u.name');
  const staffIds = new Set<string>(await ctx.knex('memberships').where({ clinic_id: client.clinic_id }).pluck('user_id'));
  const mine = reads.find((r) => r.user_id === ctx.viewer.userId)?.read_up_to as Date | undefined;
  const roleOf = (userId: string): Role => (userId === client.user_id ? 'client' : staffIds.has(userId) ? 'staff' : 'carer');
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
  if (rows.length) await markRead(ctx.knex, client.id, ctx.viewer.userId, rows[0].created_at);
  return { clientId: client.id, clientName: client.display_name, staff: canManageClient(ctx.viewer, client), messages };
}

async function markRead(knex: Knex | Knex.Transaction, clientId: string, userId: string, upTo: Date) {
  await knex('message_reads')
    .insert({ client_id: clientId, user_id: userId, read_up_to: upTo })
    .onConflict(['client_id', 'user_id'])
    .merge({ read_up_to: knex.raw('greatest(message_reads.read_up_to, excluded.read_up_to)') });
}

/** What a flag quote says: its kind and reason, as triage shows them. */
export function flagQuote(flag: Pick<FlagRow, 'kind' | 'reason' | 'raised_at'>): string {
  return `${FLAG_KIND_WORDS[flag.kind as keyof typeof FLAG_KIND_WORDS] ?? flag.kind}: ${flag.reason}`;
}

export async function sendMessage(ctx: RequestContext, clientId: string, input: z.infer<typeof messageInputSchema>) {
  const client = await accessClient(ctx, clientId, 'contribute', 'message.send');
  let quote: string | null = null;
  if (input.flagId) {
    const flag = canManageClient(ctx.viewer, client) ? await ctx.knex<FlagRow>('flags').where({ id: input.flagId, client_id: client.id }).first() : undefined;
    if (!flag) throw badRequest('That flag is not one of this client’s flags.', { fields: [{ path: 'flagId', message: 'Choose a flag of this client.' }] });
    quote = flagQuote(flag);
  }
  const row = await ctx.knex.transaction(async (trx) => {
    const [created] = await trx('messages')
      .insert({ clinic_id: client.clinic_id, client_id: client.id, author_id: ctx.viewer.userId, body: input.body, flag_id: input.flagId ?? null, flag_quote: quote })
      .returning('*');
    await markRead(trx, client.id, ctx.viewer.userId, created.created_at);
    await auditAs(ctx, { action: 'message.send', clinicId: client.clinic_id, clientId: client.id, recordType: 'message', recordId: created.id, detail: { flagId: input.flagId ?? null, chars: input.body.length } }, trx);
    await noticeOthers(trx, client, created.id, ctx.viewer.userId);
    return created;
  });
  const role = await participantRole(ctx.knex, client, ctx.viewer.userId);
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
async function noticeOthers(trx: Knex.Transaction, client: ClientRow, messageId: string, authorId: string) {
  const recipients = new Map<string, { to: Recipient }>();
  for (const to of await therapistsOf(trx as unknown as Knex, client, 'messages')) recipients.set(to.userId, { to });
  for (const to of await riderAndCarers(trx as unknown as Knex, client, 'messages')) if (!recipients.has(to.userId)) recipients.set(to.userId, { to });
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
