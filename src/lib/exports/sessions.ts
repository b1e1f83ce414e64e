import type { RequestContext } from '../auth/context';
import { scope, type Db } from '../data';
import type { ClientRow, RideRow } from '../db/tables';
import { fileSlug } from '../http/download';
import { clinicEfficiencyPct } from '../reports/energy-settings';
import { localDate } from '../time/local-date';
import { sessionsCsv } from './sessions-csv';

const who = (c: ClientRow) => ({ id: c.id, name: c.display_name, timeZone: c.time_zone });

async function efficiencyOf(db: Db, clinicId: string) {
  const clinic = await db('clinics').where({ id: clinicId }).first('fes_efficiency_pct', 'time_zone');
  return { efficiencyPct: clinicEfficiencyPct(clinic.fes_efficiency_pct), timeZone: clinic.time_zone as string };
}

/** Every session of one client as CSV: for the clinic's staff, the client and their carers. */
export async function clientSessionsCsv(ctx: RequestContext, clientId: string) {
  const grant = await scope(ctx).client(clientId, 'read', 'sessions.export');
  const client = grant.row;
  const rides: RideRow[] = await grant.db<RideRow>('rides').orderBy('started_at');
  const { efficiencyPct } = await efficiencyOf(grant.db, client.clinic_id);
  return {
    filename: `kinloop-sessions-${fileSlug(client.display_name)}-${localDate(new Date(), client.time_zone)}.csv`,
    text: sessionsCsv(rides.map((ride) => ({ client: who(client), ride })), efficiencyPct),
  };
}

/** Every session of every current client of the clinic: for its admins. */
export async function clinicSessionsCsv(ctx: RequestContext, clinicId?: string) {
  const clinic = scope(ctx).clinic(['admin'], clinicId);
  const id = clinic.id;
  const clients: ClientRow[] = await clinic.db<ClientRow>('clients');
  const byId = new Map(clients.map((c) => [c.id, c]));
  // Current clients only: the read rule leaves out the sessions of archived ones.
  const rides: RideRow[] = await clinic.db<RideRow>('rides').orderBy('started_at');
  const { efficiencyPct, timeZone } = await efficiencyOf(clinic.db, id);
  rides.sort((a, b) => byId.get(a.client_id)!.display_name.localeCompare(byId.get(b.client_id)!.display_name) || a.started_at.getTime() - b.started_at.getTime());
  await clinic.audit({ action: 'clinic.sessions_export', detail: { clients: clients.length, sessions: rides.length } });
  return {
    filename: `kinloop-clinic-sessions-${localDate(new Date(), timeZone)}.csv`,
    text: sessionsCsv(rides.map((ride) => ({ client: who(byId.get(ride.client_id)!), ride })), efficiencyPct),
  };
}
