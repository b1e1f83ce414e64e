// The access rules, in one place, used by every page and endpoint:
// admins and therapists see their clinic's clients; a carer sees linked clients;
// a client sees themself. Records the caller may not see are "not found" (404);
// actions beyond the caller's role on records they may see are "forbidden" (403).
import type { Knex } from 'knex';
import type { ClientRow, StaffRole } from '../db/tables';
import { forbidden, notFound } from '../http/errors';
import { auditAs, type RequestContext } from './context';
import type { Viewer } from './viewer';

export type ClientNeed =
  /** see the record (staff of the clinic, linked carer, the client) */
  | 'read'
  /** add ride files and checks (the same people) */
  | 'contribute'
  /** change the program: prescription, pauses, notes, flags (staff of the clinic) */
  | 'manage';

export function staffRole(viewer: Viewer, clinicId: string): StaffRole | null {
  return viewer.memberships.find((m) => m.clinicId === clinicId)?.role ?? null;
}

export function isStaffOf(viewer: Viewer, clinicId: string): boolean {
  return staffRole(viewer, clinicId) !== null;
}

export function canReadClient(viewer: Viewer, client: Pick<ClientRow, 'id' | 'clinic_id'>): boolean {
  return isStaffOf(viewer, client.clinic_id) || viewer.carerOf.includes(client.id) || viewer.clientId === client.id;
}

export function canManageClient(viewer: Viewer, client: Pick<ClientRow, 'clinic_id'>): boolean {
  return isStaffOf(viewer, client.clinic_id);
}

/**
 * Loads a client the caller needs `need` on, and writes `auditAction` to the
 * audit log, or throws 404 / 403.
 */
export async function accessClient(
  ctx: RequestContext,
  clientId: string,
  need: ClientNeed,
  auditAction: string,
  detail: Record<string, unknown> = {},
): Promise<ClientRow> {
  const client = /^[0-9a-f-]{36}$/i.test(clientId)
    ? await ctx.knex<ClientRow>('clients').where({ id: clientId }).whereNull('archived_at').first()
    : undefined;
  if (!client || !canReadClient(ctx.viewer, client)) throw notFound('That client');
  if (need === 'manage' && !canManageClient(ctx.viewer, client)) throw forbidden();
  await auditAs(ctx, { action: auditAction, clinicId: client.clinic_id, clientId: client.id, detail });
  return client;
}

/** The clients the caller may see, as a query to refine. */
export function visibleClients(knex: Knex, viewer: Viewer): Knex.QueryBuilder<ClientRow> {
  const clinics = viewer.memberships.map((m) => m.clinicId);
  const ids = [...viewer.carerOf, ...(viewer.clientId ? [viewer.clientId] : [])];
  return knex<ClientRow>('clients')
    .whereNull('archived_at')
    .where((q) => {
      q.whereIn('clinic_id', clinics.length ? clinics : ['00000000-0000-0000-0000-000000000000']);
      if (ids.length) q.orWhereIn('id', ids);
    });
}

/**
 * The clinic a staff action applies to: the one asked for, or the caller's only
 * clinic with one of `roles`. Throws 403 when the caller holds none of them there.
 */
export function staffClinic(viewer: Viewer, roles: StaffRole[], clinicId?: string | null): string {
  const eligible = viewer.memberships.filter((m) => roles.includes(m.role));
  const chosen = clinicId ? eligible.find((m) => m.clinicId === clinicId) : eligible[0];
  if (!chosen) throw forbidden();
  return chosen.clinicId;
}
