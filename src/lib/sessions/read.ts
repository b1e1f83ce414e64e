import { z } from 'zod';
import { canDownloadRaw } from '../auth/access';
import type { RequestContext } from '../auth/context';
import { scope } from '../data';
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
  const client = await scope(ctx).client(clientId, 'read', 'sessions.list');
  const q = client.db('rides').orderBy('started_at', 'desc').limit(query.limit + 1);
  if (query.before) q.where('started_at', '<', new Date(query.before));
  const rows = await q;
  const page = rows.slice(0, query.limit);
  return {
    sessions: page.map(sessionListItem),
    nextBefore: rows.length > query.limit ? page[page.length - 1].started_at.toISOString() : null,
  };
}

export const sessionQuerySchema = z.object({ points: z.coerce.number().int().min(10).max(20_000).optional() });

export async function readSession(ctx: RequestContext, id: string, points: number | null) {
  return (await sessionWithClient(ctx, id, points)).session;
}

async function sessionWithClient(ctx: RequestContext, id: string, points: number | null) {
  const { row, client } = await scope(ctx).record('session', id, 'read', 'session.view', { sessionId: id });
  const stored = await client.db('ride_series').where({ ride_id: row.id }).first('data');
  return { session: { ...sessionListItem(row), series: stored ? chartSeries(decodeSeries(stored.data), points) : null }, client };
}

/**
 * What the session page shows: the session without its series (its charts
 * fetch the series themselves, SessionCharts.tsx) and whether it has one,
 * whose it is, and whether the caller may download its ride file.
 */
export async function readSessionPage(ctx: RequestContext, id: string) {
  const { row, client } = await scope(ctx).record('session', id, 'read', 'session.view', { sessionId: id });
  const stored = await client.db('ride_series').where({ ride_id: row.id }).first('ride_id');
  const upload = await client.db('uploads').where({ id: row.upload_id }).first('uploaded_by');
  return {
    session: sessionListItem(row),
    hasSeries: stored !== undefined,
    client: { id: client.id, name: client.row.display_name, timeZone: client.row.time_zone, managed: client.managed },
    canDownload: upload !== undefined && canDownloadRaw(ctx.viewer, upload, client.row),
  };
}
