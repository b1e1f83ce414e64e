import type { Db, Query } from '../data/db';
import type { StaffRole } from '../db/tables';

/** Who is making a request, with every role they hold. */
export interface Viewer {
  userId: string;
  email: string;
  name: string;
  sessionId: string;
  memberships: { clinicId: string; role: StaffRole }[];
  /** Clients this user is an active carer of. */
  carerOf: string[];
  /** The client record that is this user themself, if any. */
  clientId: string | null;
}

export async function loadRoles(
  knex: Db,
  userId: string,
): Promise<Pick<Viewer, 'memberships' | 'carerOf' | 'clientId'>> {
  const [memberships, links, client] = await Promise.all([
    knex('memberships').where({ user_id: userId }).select('clinic_id', 'role').orderBy('created_at'),
    knex('carer_links')
      .join('clients', 'clients.id', 'carer_links.client_id')
      .where({ 'carer_links.carer_user_id': userId, 'carer_links.active': true })
      .whereNull('clients.archived_at')
      .select('carer_links.client_id')
      .orderBy('clients.display_name'),
    knex('clients').where({ user_id: userId }).whereNull('archived_at').first('id'),
  ]);
  return {
    memberships: memberships.map((m) => ({ clinicId: m.clinic_id, role: m.role })),
    carerOf: links.map((l) => l.client_id),
    clientId: client?.id ?? null,
  };
}

/** The page a user lands on after signing in: staff first, then carer, then client. */
export function homePath(v: Pick<Viewer, 'memberships' | 'carerOf' | 'clientId'>): string {
  if (v.memberships.some((m) => m.role === 'therapist')) return '/triage';
  if (v.memberships.some((m) => m.role === 'admin')) return '/admin/staff';
  if (v.carerOf.length) return '/carer';
  if (v.clientId) return '/my-week';
  return '/no-access';
}

export function meResponse(v: Viewer) {
  return {
    id: v.userId,
    email: v.email,
    name: v.name,
    memberships: v.memberships,
    carerOf: v.carerOf,
    ...(v.clientId ? { clientId: v.clientId } : {}),
  };
}
