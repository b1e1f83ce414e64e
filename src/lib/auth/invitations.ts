import { scope, type ClientGrant, type ClinicGrant, type Db, type ScopeAuditEntry } from '../data';
import { z } from 'zod';
import { audit } from '../audit/audit';
import { config } from '../config';
import type { AuthSessionRow, ClientRow, InvitationRow, UserRow } from '../db/tables';
import { HttpError, badRequest, conflict, forbidden } from '../http/errors';
import { enqueueEmail } from '../mail/outbox';
import { invitationEmail } from '../mail/templates';
import type { RequestContext } from './context';
import { hashPassword, passwordSchema, setPassword } from './password';
import { createSession } from './sessions';
import { checkPassword, findUserByEmail, normaliseEmail, type RequestMeta } from './sign-in';
import { hashToken, newToken } from './tokens';
import { line } from '../validation/fields';

export const INVITATION_DAYS = 7;

export const invitationInputSchema = z
  .object({
    email: line(z.string().trim().email('Enter a valid e-mail address.').max(254), 'E-mail'),
    name: line(z.string().trim().min(1).max(120), 'Name').optional(),
    role: z.enum(['admin', 'therapist', 'client', 'carer']),
    clinicId: z.string().uuid().optional(),
    clientId: z.string().uuid().optional(),
    relationship: line(z.string().trim().min(1).max(60), 'Relationship').optional(),
  })
  .refine((v) => (v.role === 'client' || v.role === 'carer') === Boolean(v.clientId), {
    message: 'A client or carer invitation names the client (clientId); a staff invitation does not.',
    path: ['clientId'],
  });
export type InvitationInput = z.infer<typeof invitationInputSchema>;

export const acceptInputSchema = z.object({
  token: z.string().min(20).max(200),
  name: line(z.string().trim().min(1, 'Enter your name.').max(120), 'Name').optional(),
  password: passwordSchema,
});

async function activeInvitation(knex: Db, token: string) {
  const row = await knex<InvitationRow>('invitations').where({ token_hash: hashToken(token) }).first();
  if (!row || row.accepted_at || row.revoked_at || row.expires_at.getTime() <= Date.now()) return null;
  return row;
}

/**
 * Admins invite therapists and admins to their clinic; therapists and admins
 * invite a client (to the client's own account) and a client's carers.
 */
export async function createInvitation(ctx: RequestContext, input: InvitationInput) {
  const s = scope(ctx);
  let clinicId: string;
  let grant: ClientGrant | null = null;
  let staffGrant: ClinicGrant | null = null;
  if (input.role === 'admin' || input.role === 'therapist') {
    staffGrant = s.clinic(['admin'], input.clinicId);
    clinicId = staffGrant.id;
  } else {
    grant = await s.client(input.clientId!, 'manage', 'client.view', { for: 'invitation' });
    clinicId = grant.clinicId;
    if (input.role === 'client' && grant.row.user_id) {
      throw conflict('already_has_account', `${grant.row.display_name} already has an account.`);
    }
  }
  const client: ClientRow | null = grant?.row ?? null;
  // Accounts are looked up wherever they are: the e-mail may belong to someone the inviter cannot see.
  const accounts = (grant ?? staffGrant)!.system('whether the invited e-mail has an account');
  const email = normaliseEmail(input.email);
  const existing = await findUserByEmail(accounts, email);
  if (existing && grant && input.role === 'carer') {
    const linked = await grant.db('carer_links').where({ carer_user_id: existing.id, active: true }).first();
    if (linked) throw conflict('already_linked', `${email} is already a carer of ${grant.row.display_name}.`);
  }
  if (existing && input.role === 'client') {
    const theirs = await accounts('clients').where({ user_id: existing.id }).first();
    if (theirs) throw conflict('already_client', `${email} already belongs to another client's account.`);
  }
  const { token, hash } = newToken();
  const expiresAt = new Date(Date.now() + INVITATION_DAYS * 86_400_000);
  const clinic = await s.clinics().where({ id: clinicId }).first('name', 'time_zone');
  const write = async (tx: { db: Db; audit: (entry: ScopeAuditEntry) => Promise<void>; system: (why: string) => Db }) => {
    const trx = tx.db;
    // A new invitation replaces an unanswered one for the same person and purpose.
    await trx('invitations')
      .where({ email, role: input.role, clinic_id: clinicId, client_id: client?.id ?? null })
      .whereNull('accepted_at')
      .whereNull('revoked_at')
      .update({ revoked_at: trx.fn.now() });
    const [row] = await trx<InvitationRow>('invitations')
      .insert({
        email,
        name: input.name ?? null,
        role: input.role,
        clinic_id: clinicId,
        client_id: client?.id ?? null,
        relationship: input.role === 'carer' ? (input.relationship ?? 'carer') : null,
        token_hash: hash,
        invited_by: ctx.viewer.userId,
        expires_at: expiresAt,
      })
      .returning('*');
    const mail = invitationEmail({
      inviteeName: input.name ?? null,
      inviterName: ctx.viewer.name,
      clinicName: clinic.name,
      role: input.role,
      clientName: client?.display_name ?? null,
      url: `${config().publicUrl}/invite/${token}`,
      expiresAt,
      timeZone: clinic.time_zone,
    });
    await enqueueEmail(tx.system('the invitation e-mail'), { kind: 'invitation', to: email, userId: existing?.id ?? null, ...mail });
    await tx.audit({ action: 'invitation.create', clinicId, clientId: client?.id ?? null, recordType: 'invitation', recordId: row.id, detail: { email, role: input.role } });
    return invitationView(row, client?.display_name ?? null);
  };
  return grant ? grant.transaction(write) : staffGrant!.transaction(write);
}

export function invitationView(row: InvitationRow, clientName: string | null) {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    clinicId: row.clinic_id,
    clientId: row.client_id,
    clientName,
    relationship: row.relationship,
    expiresAt: row.expires_at.toISOString(),
    createdAt: row.created_at.toISOString(),
  };
}

/** Pending invitations of the clinics where the caller is staff. */
export async function listInvitations(ctx: RequestContext) {
  if (!ctx.viewer.memberships.length) throw forbidden();
  const s = scope(ctx);
  const rows = await s
    .invitations('i')
    .leftJoin('clients as c', 'c.id', 'i.client_id')
    .whereNull('i.accepted_at')
    .whereNull('i.revoked_at')
    .where('i.expires_at', '>', s.db.fn.now())
    .orderBy('i.created_at', 'desc')
    .select('i.*', 'c.display_name as client_name');
  return rows.map((r: InvitationRow & { client_name: string | null }) => invitationView(r, r.client_name));
}

export async function revokeInvitation(ctx: RequestContext, id: string) {
  const s = scope(ctx);
  const row: InvitationRow | undefined = /^[0-9a-f-]{36}$/i.test(id) ? await s.invitations().where({ id }).first() : undefined;
  if (!row) throw new HttpError(404, 'not_found', 'That invitation was not found.');
  const clinic = s.clinic(['admin', 'therapist'], row.clinic_id);
  if ((row.role === 'admin' || row.role === 'therapist') && clinic.role !== 'admin') throw forbidden();
  await clinic.db('invitations').where({ id }).whereNull('accepted_at').update({ revoked_at: clinic.db.fn.now() });
  await clinic.audit({ clientId: row.client_id, action: 'invitation.revoke', recordType: 'invitation', recordId: id });
}

/** What the invitation page shows before the invitee sets a password. */
export async function previewInvitation(knex: Db, token: string) {
  const row = await activeInvitation(knex, token);
  if (!row) return null;
  const [clinic, client, existing] = await Promise.all([
    knex('clinics').where({ id: row.clinic_id }).first('name'),
    row.client_id ? knex('clients').where({ id: row.client_id }).first('display_name') : null,
    findUserByEmail(knex, row.email),
  ]);
  return {
    email: row.email,
    name: row.name,
    role: row.role,
    clinicName: clinic.name as string,
    clientName: (client?.display_name as string | undefined) ?? null,
    hasAccount: Boolean(existing?.password_hash),
  };
}

/**
 * Accepts an invitation: creates the account (or, for an e-mail that already
 * has one, checks its password — a sign-in attempt under the sign-in limits)
 * and grants the role. Single use.
 */
export async function acceptInvitation(
  knex: Db,
  input: z.infer<typeof acceptInputSchema>,
  meta: RequestMeta,
): Promise<{ user: UserRow; session: AuthSessionRow }> {
  const invalid = () => new HttpError(410, 'invitation_invalid', 'This invitation link has expired, was already used, or was withdrawn. Ask your clinic to send a new one.');
  const disabled = () => new HttpError(403, 'account_disabled', 'The account for this e-mail is disabled. Contact your clinic.');
  const invitation = await activeInvitation(knex, input.token);
  if (!invitation) throw invalid();
  const existing = await findUserByEmail(knex, invitation.email);
  if (existing?.disabled_at) throw disabled();
  // Both slow steps (checking or hashing the password) run before the transaction.
  const proven = existing?.password_hash
    ? await checkPassword(knex, { email: invitation.email, password: input.password }, meta, {
        via: 'invitation',
        wrongMessage: 'An account with this e-mail already exists: enter its current password to accept the invitation.',
      })
    : null;
  const newHash = proven ? null : await hashPassword(input.password);
  return knex.transaction(async (trx) => {
    const row = await activeInvitation(trx, input.token);
    if (!row || row.id !== invitation.id) throw invalid();
    // Claim the invitation first so that two tabs cannot both use it.
    const claimed = await trx('invitations').where({ id: row.id }).whereNull('accepted_at').update({ accepted_at: trx.fn.now() });
    if (claimed !== 1) throw new HttpError(410, 'invitation_invalid', 'This invitation link was already used.');

    let user = await findUserByEmail(trx, row.email);
    if (user?.disabled_at) throw disabled();
    if (user?.password_hash) {
      // The password checked above must still be this account's.
      if (!proven || proven.id !== user.id || proven.password_hash !== user.password_hash) {
        throw conflict('account_changed', 'The account for this e-mail changed while the invitation was being accepted. Open the link again.');
      }
    } else {
      const name = input.name ?? row.name;
      if (!name) throw badRequest('Enter your name.', { fields: [{ path: 'name', message: 'Enter your name.' }] });
      if (user) {
        user = await setPassword(trx, user.id, newHash!, { name });
      } else {
        [user] = await trx<UserRow>('users').insert({ email: row.email, name, password_hash: newHash! }).returning('*');
      }
    }
    const u = user!;
    if (row.role === 'admin' || row.role === 'therapist') {
      await trx('memberships')
        .insert({ user_id: u.id, clinic_id: row.clinic_id, role: row.role })
        .onConflict(['user_id', 'clinic_id'])
        .merge({ role: row.role });
    } else if (row.role === 'carer') {
      await trx('carer_links')
        .insert({ carer_user_id: u.id, client_id: row.client_id, relationship: row.relationship ?? 'carer', active: true })
        .onConflict(['carer_user_id', 'client_id'])
        .merge({ active: true, relationship: row.relationship ?? 'carer' });
    } else {
      const updated = await trx('clients').where({ id: row.client_id }).whereNull('user_id').update({ user_id: u.id, updated_at: trx.fn.now() });
      if (updated !== 1) throw conflict('already_has_account', 'This client already has an account.');
    }
    await trx('invitations').where({ id: row.id }).update({ accepted_user_id: u.id });
    const session = await createSession(trx, u.id, meta);
    await audit(trx, { actorUserId: u.id, action: 'invitation.accept', clinicId: row.clinic_id, clientId: row.client_id, recordType: 'invitation', recordId: row.id, ip: meta.ip, userAgent: meta.userAgent });
    await audit(trx, { actorUserId: u.id, action: 'auth.sign_in', ip: meta.ip, userAgent: meta.userAgent, recordType: 'auth_session', recordId: session.id, detail: { via: 'invitation' } });
    return { user: u, session };
  });
}
