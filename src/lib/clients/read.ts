import { accessClient, visibleClients } from '../auth/access';
import { auditListed, type RequestContext } from '../auth/context';
import { clientView } from './view';

export async function listVisibleClients(ctx: RequestContext) {
  const rows = await visibleClients(ctx.knex, ctx.viewer).orderBy('display_name');
  await auditListed(ctx, 'clients.list', rows);
  return rows.map(clientView);
}

export async function readClient(ctx: RequestContext, clientId: string) {
  const row = await accessClient(ctx, clientId, 'read', 'client.view');
  const carers = await ctx.knex('carer_links as l')
    .join('users as u', 'u.id', 'l.carer_user_id')
    .where({ 'l.client_id': row.id, 'l.active': true })
    .orderBy('u.name')
    .select('u.id', 'u.name', 'l.relationship');
  return { ...clientView(row), carers: carers.map((c) => ({ userId: c.id, name: c.name, relationship: c.relationship })) };
}
