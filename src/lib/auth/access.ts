// The access rules, in one place, used by every page and endpoint:
// admins and therapists see their clinic's clients; a carer sees linked clients;
// a client sees themself. Records the caller may not see are "not found" (404);
// actions beyond the caller's role on records they may see are "forbidden" (403).
import type { Knex } from 'knex';
import type { ClientRow, StaffRole, UploadRow } from '../db/tables';
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

/** The stored bytes of a ride file: for the person who uploaded it and the client's clinic. */
export function canDownloadRaw(viewer: Viewer, upload: Pick<UploadRow, 'uploaded_by'>, client: Pick<ClientRow, 'clinic_id'>): boolean {
  return upload.uploaded_by === viewer.userId || canManageClient(viewer, client);
}

/** Reading a file again: the clinic for any file (after an import profile changed); the uploader for a file whose reading failed. */
export function canReprocess(viewer: Viewer, upload: Pick<UploadRow, 'uploaded_by' | 'status'>, client: Pick<ClientRow, 'clinic_id'>): boolean {
  return canManageClient(viewer, client) || (upload.uploaded_by === viewer.userId && upload.status === 'failed');
}

/** What a refusal names: the record asked for, so that "missing" and "not yours" read the same. */
export interface AskedRecord {
  /** "That session", "That flag": the words of the 404. */
  what: string;
  type: string;
  id: string;
}

const isUuid = (id: string) => /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(id);

/**
 * A refused request for a client's record leaves a trace. A record the caller
 * may not see (404) is logged without its clinic, so that no clinic's admins
 * learn of another clinic's records; the caller's own clinic sees that they
 * were refused. A role refusal (403) on a record they may see names it.
 */
async function auditRefusal(ctx: RequestContext, status: 403 | 404, asked: AskedRecord, need: ClientNeed, action: string, client?: ClientRow) {
  await auditAs(ctx, {
    action: 'access.denied',
    clinicId: client?.clinic_id ?? null,
    clientId: client?.id ?? null,
    recordType: asked.type,
    recordId: asked.id,
    detail: { status, need, action },
  });
}

/**
 * Loads a client the caller needs `need` on, and writes `auditAction` to the
 * audit log, or throws 404 / 403 (and logs the refusal). `asked` is the record
 * the request named when it was not the client itself (a session, a flag).
 */
export async function accessClient(
  ctx: RequestContext,
  clientId: string,
  need: ClientNeed,
  auditAction: string,
  detail: Record<string, unknown> = {},
  asked: AskedRecord = { what: 'That client', type: 'client', id: clientId },
): Promise<ClientRow> {
  const client = isUuid(clientId) ? await ctx.knex<ClientRow>('clients').where({ id: clientId }).whereNull('archived_at').first() : undefined;
  if (!client || !canReadClient(ctx.viewer, client)) {
    await auditRefusal(ctx, 404, asked, need, auditAction);
    throw notFound(asked.what);
  }
  if (need === 'manage' && !canManageClient(ctx.viewer, client)) {
    await auditRefusal(ctx, 403, asked, need, auditAction, client);
    throw forbidden();
  }
  await auditAs(ctx, { action: auditAction, clinicId: client.clinic_id, clientId: client.id, detail });
  return client;
}

/**
 * A client's record asked for by its own id (a session, a flag, an upload):
 * a missing record and one of a client the caller may not see answer the same
 * 404, and both are logged.
 */
export async function accessClientRecord<T extends { client_id: string }>(
  ctx: RequestContext,
  row: T | undefined,
  asked: AskedRecord,
  need: ClientNeed,
  auditAction: string,
  detail: Record<string, unknown> = {},
): Promise<{ row: T; client: ClientRow }> {
  if (!row) {
    await auditRefusal(ctx, 404, asked, need, auditAction);
    throw notFound(asked.what);
  }
  return { row, client: await accessClient(ctx, row.client_id, need, auditAction, detail, asked) };
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
