import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { byNameSql, scope, whereNameHasWords } from '../data';
import { line } from '../validation/fields';
import { clientView } from './view';

/** A page of the clients the caller may see, by name; `q`: words the name must contain. */
export const clientListQuerySchema = z
  .object({
    limit: z.coerce.number({ message: 'limit: a whole number from 1 to 200.' }).int('limit: a whole number from 1 to 200.').min(1).max(200).default(50),
    offset: z.coerce.number({ message: 'offset: a whole number from 0.' }).int('offset: a whole number from 0.').min(0).max(1_000_000).default(0),
    q: line(z.string().max(100, 'Search: at most 100 characters.'), 'Search').default(''),
    /** 1: only the clients the caller cares for (a carer who is also staff gets their own, not the clinic's). */
    linked: z.enum(['0', '1']).default('0'),
  })
  .strict();
export type ClientListQuery = z.infer<typeof clientListQuerySchema>;

export async function listVisibleClients(ctx: RequestContext, query: ClientListQuery = clientListQuerySchema.parse({})) {
  const s = scope(ctx);
  const matching = () =>
    s.clients().modify((q) => {
      whereNameHasWords(q, 'display_name', query.q);
      if (query.linked === '1') q.whereIn('id', ctx.viewer.carerOf);
    });
  const [{ count }] = await matching().count({ count: '*' });
  const rows = await matching().orderByRaw(byNameSql('display_name', 'id')).offset(query.offset).limit(query.limit);
  await s.listed('clients.list', rows);
  const total = Number(count);
  const next = query.offset + rows.length;
  return { clients: rows.map(clientView), total, offset: query.offset, limit: query.limit, nextOffset: next < total ? next : null };
}

export async function readClient(ctx: RequestContext, clientId: string) {
  const client = await scope(ctx).client(clientId, 'read', 'client.view');
  const row = client.row;
  const carers = await client.db('carer_links as l')
    .join('users as u', 'u.id', 'l.carer_user_id')
    .where({ 'l.active': true })
    .orderBy('u.name')
    .select('u.id', 'u.name', 'l.relationship');
  return { ...clientView(row), carers: carers.map((c) => ({ userId: c.id, name: c.name, relationship: c.relationship })) };
}
