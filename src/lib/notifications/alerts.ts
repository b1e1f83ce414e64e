import type { Db, Query } from '../data/db';
import { config } from '../config';
import type { ClientRow, FlagRow } from '../db/tables';
import { enqueueEmail } from '../mail/outbox';
import { FLAG_KIND_WORDS } from '../flags/words';
import { notificationEmail } from './compose';
import { therapistsOf } from './recipients';

/**
 * The immediate e-mail for an urgent flag, to the client's therapists. Queued
 * once per flag and episode, so re-evaluations never resend it; a flag whose
 * condition has already cleared (files that came in late) is history for the
 * triage list, not an alert.
 */
export async function alertUrgentFlag(knex: Db, flag: FlagRow): Promise<number> {
  if (flag.severity !== 'urgent' || flag.state !== 'open' || flag.cleared_at !== null) return 0;
  const client = await knex<ClientRow>('clients').where({ id: flag.client_id }).first();
  if (!client) return 0;
  let queued = 0;
  for (const to of await therapistsOf(knex, client, 'urgent_alerts')) {
    const id = await enqueueEmail(
      knex,
      notificationEmail(to, 'urgent_alerts', {
        kind: 'urgent_flag',
        subject: `Urgent: ${FLAG_KIND_WORDS[flag.kind].toLowerCase()} for ${client.display_name}`,
        paragraphs: [`Kinloop raised an urgent flag for ${client.display_name}: ${flag.reason}`, 'Please review it and follow your clinic’s protocol.'],
        action: { label: `Open ${client.display_name} in Kinloop`, url: `${config().publicUrl}/clients/${client.id}` },
        dedupeKey: `urgent:${flag.id}:${to.userId}:${flag.anchor}`,
        caution: true,
      }),
    );
    if (id) queued++;
  }
  return queued;
}
