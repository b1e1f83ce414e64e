import type { Db, Query } from '../data/db';
import { z } from 'zod';
import { audit } from '../audit/audit';
import { config } from '../config';
import type { AuthSessionRow, PasswordResetRow, UserRow } from '../db/tables';
import { HttpError } from '../http/errors';
import { enqueueEmail } from '../mail/outbox';
import { passwordResetEmail } from '../mail/templates';
import { hashPassword, passwordSchema, setPassword } from './password';
import { createSession, revokeUserSessions } from './sessions';
import { findUserByEmail, type RequestMeta } from './sign-in';
import { hashToken, newToken } from './tokens';
import { line } from '../validation/fields';

export const RESET_MINUTES = 60;
const MAX_RESETS_PER_HOUR = 5;

export const resetRequestSchema = z.object({ email: line(z.string().trim().email('Enter a valid e-mail address.').max(254), 'E-mail') });
export const resetCompleteSchema = z.object({ token: z.string().min(20).max(200), password: passwordSchema });

/** Sends a reset link when the e-mail has an active account; answers the same either way. */
export async function requestPasswordReset(knex: Db, email: string, meta: RequestMeta): Promise<void> {
  const user = await findUserByEmail(knex, email);
  if (!user || user.disabled_at || !user.password_hash) {
    await audit(knex, { actorUserId: null, action: 'auth.reset_requested_unknown', ip: meta.ip, userAgent: meta.userAgent, detail: { email } });
    return;
  }
  const recent = await knex('password_resets')
    .where({ user_id: user.id })
    .where('created_at', '>', new Date(Date.now() - 3_600_000))
    .count<{ count: string }[]>('* as count');
  if (Number(recent[0].count) >= MAX_RESETS_PER_HOUR) return;
  const { token, hash } = newToken();
  await knex.transaction(async (trx) => {
    // Only the newest link works: an older e-mail in someone else's hands is worthless.
    await trx('password_resets').where({ user_id: user.id }).whereNull('used_at').whereNull('revoked_at').update({ revoked_at: trx.fn.now() });
    await trx('password_resets').insert({ user_id: user.id, token_hash: hash, expires_at: new Date(Date.now() + RESET_MINUTES * 60_000) });
    const mail = passwordResetEmail({ name: user.name, url: `${config().publicUrl}/reset/${token}`, expiresMinutes: RESET_MINUTES });
    await enqueueEmail(trx, { kind: 'password_reset', to: user.email, userId: user.id, ...mail });
    await audit(trx, { actorUserId: user.id, action: 'auth.reset_requested', ip: meta.ip, userAgent: meta.userAgent });
  });
}

const usable = (row: PasswordResetRow | undefined): row is PasswordResetRow =>
  Boolean(row && !row.used_at && !row.revoked_at && row.expires_at.getTime() > Date.now());

export async function resetTokenIsValid(knex: Db, token: string): Promise<boolean> {
  return usable(await knex<PasswordResetRow>('password_resets').where({ token_hash: hashToken(token) }).first());
}

/** Sets the new password, ends every other session of the account and signs the user in. */
export async function completePasswordReset(
  knex: Db,
  input: z.infer<typeof resetCompleteSchema>,
  meta: RequestMeta,
): Promise<{ user: UserRow; session: AuthSessionRow }> {
  const passwordHash = await hashPassword(input.password);
  return knex.transaction(async (trx) => {
    const row = await trx<PasswordResetRow>('password_resets').where({ token_hash: hashToken(input.token) }).forUpdate().first();
    if (!usable(row)) {
      throw new HttpError(410, 'reset_invalid', 'This reset link has expired, was already used or was replaced by a newer one. Ask for a new one from the sign-in page.');
    }
    const user = await trx<UserRow>('users').where({ id: row.user_id }).first();
    if (!user || user.disabled_at) throw new HttpError(410, 'reset_invalid', 'This account is disabled. Contact your clinic.');
    await trx('password_resets').where({ id: row.id }).update({ used_at: trx.fn.now() });
    await setPassword(trx, user.id, passwordHash);
    await revokeUserSessions(trx, user.id);
    const session = await createSession(trx, user.id, meta);
    await audit(trx, { actorUserId: user.id, action: 'auth.password_reset', ip: meta.ip, userAgent: meta.userAgent, recordType: 'auth_session', recordId: session.id });
    return { user, session };
  });
}
