import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import { clientView } from './view';

export async function listVisibleClients(ctx: RequestContext) {
  const s = scope(ctx);
  const rows = await s.clients().orderBy('display_name');
  await s.listed('clients.list', rows);
  return rows.map(clientView);
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
