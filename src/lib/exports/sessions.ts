import { accessClient, staffClinic } from '../auth/access';
import { auditAs, type RequestContext } from '../auth/context';
import type { ClientRow, RideRow } from '../db/tables';
import { fileSlug } from '../http/download';
import { clinicEfficiencyPct } from '../reports/energy-settings';
import { localDate } from '../time/local-date';
import { sessionsCsv } from './sessions-csv';

const who = (c: ClientRow) => ({ id: c.id, name: c.display_name, timeZone: c.time_zone });

async function efficiencyOf(ctx: RequestContext, clinicId: string) {
  const clinic = await ctx.knex('clinics').where({ id: clinicId }).first('fes_efficiency_pct', 'time_zone');
  return { efficiencyPct: clinicEfficiencyPct(clinic.fes_efficiency_pct), timeZone: clinic.time_zone as string };
}

/** Every session of one client as CSV: for the clinic's staff, the client and their carers. */
export async function clientSessionsCsv(ctx: RequestContext, clientId: string) {
  const client = await accessClient(ctx, clientId, 'read', 'sessions.export');
  const rides = await ctx.knex<RideRow>('rides').where({ client_id: client.id }).orderBy('started_at');
  const { efficiencyPct } = await efficiencyOf(ctx, client.clinic_id);
  return {
    filename: `kinloop-sessions-${fileSlug(client.display_name)}-${localDate(new Date(), client.time_zone)}.csv`,
    text: sessionsCsv(rides.map((ride) => ({ client: who(client), ride })), efficiencyPct),
  };
}

/** Every session of every current client of the clinic: for its admins. */
export async function clinicSessionsCsv(ctx: RequestContext, clinicId?: string) {
  const id = staffClinic(ctx.viewer, ['admin'], clinicId);
  const clients = await ctx.knex<ClientRow>('clients').where({ clinic_id: id }).whereNull('archived_at');
  const byId = new Map(clients.map((c) => [c.id, c]));
  const rides = await ctx.knex<RideRow>('rides').where({ clinic_id: id }).whereIn('client_id', [...byId.keys()]).orderBy('started_at');
  const { efficiencyPct, timeZone } = await efficiencyOf(ctx, id);
  rides.sort((a, b) => byId.get(a.client_id)!.display_name.localeCompare(byId.get(b.client_id)!.display_name) || a.started_at.getTime() - b.started_at.getTime());
  await auditAs(ctx, { action: 'clinic.sessions_export', clinicId: id, detail: { clients: clients.length, sessions: rides.length } });
  return {
    filename: `kinloop-clinic-sessions-${localDate(new Date(), timeZone)}.csv`,
    text: sessionsCsv(rides.map((ride) => ({ client: who(byId.get(ride.client_id)!), ride })), efficiencyPct),
  };
}
