import { DateTime } from 'luxon';
import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import type { PauseRow } from '../db/tables';
import { badRequest, notFound } from '../http/errors';
import { scheduleFlagEvaluation } from './flag-jobs';
import { calendarDate, line } from '../validation/fields';

export const pauseInputSchema = z
  .object({ from: calendarDate('From'), to: calendarDate('To'), reason: line(z.string().trim().min(1, 'Reason: say why the program pauses (for example: hospital stay).').max(200), 'Reason') })
  .strict()
  .refine((p) => p.to >= p.from, { message: 'To: the pause must end on or after the day it starts.', path: ['to'] })
  .refine((p) => DateTime.fromISO(p.to).diff(DateTime.fromISO(p.from), 'days').days <= 366, { message: 'To: a pause lasts at most a year; add another one after it if needed.', path: ['to'] });

export function pauseState(p: PauseRow, today: string): 'cancelled' | 'upcoming' | 'active' | 'ended' {
  if (p.cancelled_at) return 'cancelled';
  if (p.starts_on > today) return 'upcoming';
  return p.ends_on >= today ? 'active' : 'ended';
}

export function pauseView(p: PauseRow, today: string) {
  return { id: p.id, from: p.starts_on, to: p.ends_on, reason: p.reason, state: pauseState(p, today), createdAt: p.created_at.toISOString(), endedAt: p.ended_at?.toISOString() ?? null };
}

export async function listPauses(ctx: RequestContext, clientId: string) {
  const client = await scope(ctx).client(clientId, 'read', 'pauses.list');
  const today = DateTime.now().setZone(client.row.time_zone).toISODate()!;
  const rows: PauseRow[] = await client.db<PauseRow>('pauses').orderBy('starts_on', 'desc');
  return { pauses: rows.map((p) => pauseView(p, today)) };
}

export async function createPause(ctx: RequestContext, clientId: string, input: z.infer<typeof pauseInputSchema>) {
  const client = await scope(ctx).client(clientId, 'manage', 'pause.create');
  const [row] = await client.db<PauseRow>('pauses').insert({ starts_on: input.from, ends_on: input.to, reason: input.reason, created_by: ctx.viewer.userId }).returning('*');
  await client.audit({ action: 'pause.create', recordType: 'pause', recordId: row.id, detail: { from: input.from, to: input.to } });
  await scheduleFlagEvaluation(client.id, 0);
  return pauseView(row, DateTime.now().setZone(client.row.time_zone).toISODate()!);
}

/**
 * Ends a pause early: one under way ends yesterday (today counts again); one
 * that has not begun is cancelled. Nothing is deleted.
 */
export async function endPause(ctx: RequestContext, clientId: string, pauseId: string) {
  const client = await scope(ctx).client(clientId, 'manage', 'pause.end');
  const row: PauseRow | undefined = z.string().uuid().safeParse(pauseId).success ? await client.db<PauseRow>('pauses').where({ id: pauseId }).first() : undefined;
  if (!row) throw notFound('That pause');
  const today = DateTime.now().setZone(client.row.time_zone);
  const state = pauseState(row, today.toISODate()!);
  if (state === 'ended' || state === 'cancelled') throw badRequest('This pause is over already.');
  const change = state === 'upcoming' || row.starts_on === today.toISODate()
    ? { cancelled_at: client.db.fn.now() }
    : { ends_on: today.minus({ days: 1 }).toISODate()! };
  const [updated] = await client.db<PauseRow>('pauses').where({ id: row.id }).update({ ...change, ended_at: client.db.fn.now(), ended_by: ctx.viewer.userId } as never).returning('*');
  await client.audit({ action: 'pause.end', recordType: 'pause', recordId: row.id });
  await scheduleFlagEvaluation(client.id, 0);
  return pauseView(updated, today.toISODate()!);
}
