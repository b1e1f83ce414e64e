import type { Db, Query } from '../data/db';
import type { OutboxEmailRow } from '../db/tables';
import { config } from '../config';
import { mailTransport } from './transport';

export interface EmailMessage {
  kind: string;
  to: string;
  userId?: string | null;
  subject: string;
  text: string;
  html: string;
  headers?: Record<string, string>;
  /** Mail with the same key is queued once only (one reminder a day, one digest a day, one alert per flag change). */
  dedupeKey?: string;
}

/** Queues an e-mail (pass the transaction of the change that causes it); null when its dedupe key was queued before. */
export async function enqueueEmail(knex: Db, message: EmailMessage): Promise<string | null> {
  const rows = await knex('outbox_emails')
    .insert({
      kind: message.kind,
      user_id: message.userId ?? null,
      to_address: message.to,
      subject: message.subject,
      text_body: message.text,
      html_body: message.html,
      headers: JSON.stringify(message.headers ?? {}),
      dedupe_key: message.dedupeKey ?? null,
    })
    .onConflict('dedupe_key')
    .ignore()
    .returning('id');
  return rows[0]?.id ?? null;
}

// 15 s, 30 s, 1 min … capped at one hour: a mail server that is down for a
// while gets tried again soon after it is back, without a storm of attempts.
export function retryDelayMs(attempts: number): number {
  return Math.min(config().outboxRetryMs * 2 ** Math.max(0, attempts - 1), 3_600_000);
}

/**
 * Sends what is due. Each row is claimed with SKIP LOCKED inside its own
 * transaction and marked sent in it, so two workers never send the same mail.
 */
export async function deliverDueEmails(knex: Db, limit = 20): Promise<{ sent: number; failed: number }> {
  let sent = 0;
  let failed = 0;
  for (let i = 0; i < limit; i++) {
    const outcome = await knex.transaction(async (trx) => {
      const row = await trx<OutboxEmailRow>('outbox_emails')
        .whereNull('sent_at')
        .where('next_attempt_at', '<=', trx.fn.now())
        .orderBy('next_attempt_at')
        .forUpdate()
        .skipLocked()
        .first();
      if (!row) return 'none' as const;
      try {
        await mailTransport().sendMail({
          to: row.to_address,
          subject: row.subject,
          text: row.text_body,
          html: row.html_body,
          headers: row.headers,
        });
        await trx('outbox_emails').where({ id: row.id }).update({ sent_at: trx.fn.now(), attempts: row.attempts + 1, last_error: null });
        return 'sent' as const;
      } catch (err) {
        const attempts = row.attempts + 1;
        await trx('outbox_emails')
          .where({ id: row.id })
          .update({
            attempts,
            last_error: String((err as Error).message ?? err).slice(0, 500),
            next_attempt_at: new Date(Date.now() + retryDelayMs(attempts)),
          });
        return 'failed' as const;
      }
    });
    if (outcome === 'none') break;
    if (outcome === 'sent') sent++;
    else {
      failed++;
      // The server is likely down; the rest waits for the next round.
      break;
    }
  }
  return { sent, failed };
}
