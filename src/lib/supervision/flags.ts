import { DateTime } from 'luxon';
import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope, type Db } from '../data';
import type { FlagEventRow, FlagRow } from '../db/tables';
import { badRequest } from '../http/errors';
import { calendarDate, paragraph } from '../validation/fields';

export const flagActionSchema = z
  .object({
    action: z.enum(['acknowledge', 'resolve', 'snooze']),
    note: paragraph(z.string().trim().max(2000, 'A note is at most 2000 characters.'), 'Note').optional(),
    until: calendarDate('Snooze until').optional(),
  })
  .strict()
  .refine((a) => a.action !== 'snooze' || a.until, { message: 'Snooze until: choose the date the flag should come back.', path: ['until'] });

export function flagView(row: FlagRow) {
  return {
    id: row.id,
    clientId: row.client_id,
    kind: row.kind,
    severity: row.severity,
    state: row.state,
    raisedAt: row.raised_at.toISOString(),
    updatedAt: row.updated_at.toISOString(),
    reason: row.reason,
    evidence: row.evidence,
    clearedAt: row.cleared_at?.toISOString() ?? null,
    snoozedUntil: row.snoozed_until,
  };
}
export type FlagView = ReturnType<typeof flagView>;

/** Acknowledge (seen, still live), resolve (closed) or snooze (hidden from triage until a date), with an optional note. */
export async function actOnFlag(ctx: RequestContext, flagId: string, input: z.infer<typeof flagActionSchema>) {
  const { row: flag, client } = await scope(ctx).record('flag', flagId, 'manage', 'flag.act', { flagId, action: input.action });
  if (flag.state === 'resolved' || flag.state === 'withdrawn') throw badRequest(`This flag is ${flag.state} already.`);
  const today = DateTime.now().setZone(client.row.time_zone).toISODate()!;
  if (input.action === 'snooze' && input.until! <= today) {
    throw badRequest('Snooze until: choose a date after today.', { fields: [{ path: 'until', message: 'Choose a date after today.' }] });
  }
  const change =
    input.action === 'acknowledge'
      ? { state: 'acknowledged' }
      : input.action === 'resolve'
        ? { state: 'resolved', closed_at: client.db.fn.now() }
        : { snoozed_until: input.until };
  const row = await client.transaction(async (tx) => {
    const [updated] = await tx.db<FlagRow>('flags').where({ id: flag.id }).update({ ...change, updated_at: tx.db.fn.now() } as never).returning('*');
    await tx.db('flag_events').insert({
      flag_id: flag.id,
      actor_user_id: ctx.viewer.userId,
      action: input.action === 'acknowledge' ? 'acknowledged' : input.action === 'resolve' ? 'resolved' : 'snoozed',
      note: input.note ?? null,
      detail: JSON.stringify(input.action === 'snooze' ? { until: input.until } : {}),
    });
    await tx.audit({ action: `flag.${input.action}`, recordType: 'flag', recordId: flag.id });
    return updated;
  });
  return flagView(row);
}

/** Every flag of a client, newest first, each with its history. */
export async function clientFlags(ctx: RequestContext, clientId: string) {
  const client = await scope(ctx).client(clientId, 'manage', 'flags.list');
  return { flags: await flagsWithHistory(client.db, client.id) };
}

/** The flags of a client the caller has already been given access to. */
export async function flagsWithHistory(db: Db, clientId: string) {
  const rows: FlagRow[] = await db<FlagRow>('flags').where({ client_id: clientId }).orderBy('raised_at', 'desc');
  const events = rows.length
    ? await db('flag_events as e').leftJoin('users as u', 'u.id', 'e.actor_user_id').whereIn('e.flag_id', rows.map((r) => r.id)).orderBy('e.id').select('e.*', 'u.name as actor_name')
    : [];
  return rows.map((r) => ({
    ...flagView(r),
    history: events
      .filter((e: FlagEventRow) => e.flag_id === r.id)
      .map((e: FlagEventRow & { actor_name: string | null }) => ({ at: e.at.toISOString(), action: e.action, by: e.actor_user_id ? { userId: e.actor_user_id, name: e.actor_name } : null, note: e.note, detail: e.detail })),
  }));
}
