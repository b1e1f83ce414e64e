// The access rules, in one place, pure: admins and therapists see their
// clinic's clients; a carer sees linked clients; a client sees themself.
// src/lib/data applies them to every query and record (records the caller
// may not see are "not found", 404; actions beyond the caller's role on
// records they may see are "forbidden", 403); pages use them to decide what
// to offer.
import type { ClientRow, StaffRole, UploadRow } from '../db/tables';
import { forbidden } from '../http/errors';
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
