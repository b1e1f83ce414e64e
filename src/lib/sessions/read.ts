import { z } from 'zod';
import { accessClient, accessClientRecord } from '../auth/access';
import type { RequestContext } from '../auth/context';
import type { RideRow } from '../db/tables';
import { decodeSeries } from '../rides/series-codec';
import { chartSeries } from './chart-series';
import { sessionListItem } from './view';
import { instant } from '../validation/fields';

export const sessionsQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(50),
  before: instant('before').optional(),
});

/** A client's sessions, newest first; `nextBefore` pages on. */
export async function listSessions(ctx: RequestContext, clientId: string, query: z.infer<typeof sessionsQuerySchema>) {
  const client = await accessClient(ctx, clientId, 'read', 'sessions.list');
  const q = ctx.knex<RideRow>('rides').where({ client_id: client.id }).orderBy('started_at', 'desc').limit(query.limit + 1);
  if (query.before) q.where('started_at', '<', new Date(query.before));
  const rows = await q;
  const page = rows.slice(0, query.limit);
  return {
    sessions: page.map(sessionListItem),
    nextBefore: rows.length > query.limit ? page[page.length - 1].started_at.toISOString() : null,
  };
}

export const sessionQuerySchema = z.object({ points: z.coerce.number().int().min(10).max(20_000).optional() });

/** A session without its series, and whether it has one (the session page; its charts fetch the series themselves). */
export async function readSessionHead(ctx: RequestContext, id: string) {
  const found = z.string().uuid().safeParse(id).success ? await ctx.knex<RideRow>('rides').where({ id }).first() : undefined;
  const { row } = await accessClientRecord(ctx, found, { what: 'That session', type: 'session', id }, 'read', 'session.view', { sessionId: id });
  const stored = await ctx.knex('ride_series').where({ ride_id: id }).first(ctx.knex.raw('1 AS present'));
  return { ...sessionListItem(row), hasSeries: stored !== undefined };
}

export async function readSession(ctx: RequestContext, id: string, points: number | null) {
  const found = z.string().uuid().safeParse(id).success ? await ctx.knex<RideRow>('rides').where({ id }).first() : undefined;
  const { row } = await accessClientRecord(ctx, found, { what: 'That session', type: 'session', id }, 'read', 'session.view', { sessionId: id });
  const stored = await ctx.knex('ride_series').where({ ride_id: id }).first('data');
  return { ...sessionListItem(row), series: stored ? chartSeries(decodeSeries(stored.data), points) : null };
}
