import type { Knex } from 'knex';
import { audit } from '../audit/audit';
import type { AuthSessionRow, UserRow } from '../db/tables';
import { HttpError } from '../http/errors';
import { decoyHash, verifyPassword } from './password';
import { recordSignInAttempt, signInBlockedMinutes } from './rate-limit';
import { createSession } from './sessions';

export interface RequestMeta {
  ip: string;
  userAgent: string | null;
}

const BAD_CREDENTIALS = 'That e-mail and password do not match an active account. Check both and try again, or reset your password.';

export function normaliseEmail(email: string): string {
  return email.trim().toLowerCase();
}

export async function findUserByEmail(knex: Knex | Knex.Transaction, email: string): Promise<UserRow | undefined> {
  return knex<UserRow>('users').whereRaw('lower(email) = ?', [normaliseEmail(email)]).first();
}

export async function signIn(
  knex: Knex,
  input: { email: string; password: string },
  meta: RequestMeta,
): Promise<{ user: UserRow; session: AuthSessionRow }> {
  const email = normaliseEmail(input.email);
  const waitMinutes = await signInBlockedMinutes(knex, email, meta.ip);
  if (waitMinutes > 0) {
    await audit(knex, { actorUserId: null, action: 'auth.sign_in_blocked', ip: meta.ip, userAgent: meta.userAgent, detail: { email } });
    throw new HttpError(
      429,
      'too_many_attempts',
      `Too many sign-in attempts. For your security, try again in ${waitMinutes} minute${waitMinutes === 1 ? '' : 's'}, or reset your password.`,
      { retryAfterMinutes: waitMinutes },
      { 'retry-after': String(waitMinutes * 60) },
    );
  }
  const user = await findUserByEmail(knex, email);
  const matches = user
    ? await verifyPassword(user.password_hash, input.password)
    : await verifyPassword(await decoyHash(), input.password).then(() => false);
  if (!user || !matches || user.disabled_at) {
    await recordSignInAttempt(knex, email, meta.ip, false);
    await audit(knex, {
      actorUserId: user?.id ?? null,
      action: 'auth.sign_in_failed',
      ip: meta.ip,
      userAgent: meta.userAgent,
      detail: { email, reason: !user ? 'unknown_email' : user.disabled_at ? 'disabled' : 'wrong_password' },
    });
    throw new HttpError(401, 'bad_credentials', BAD_CREDENTIALS);
  }
  await recordSignInAttempt(knex, email, meta.ip, true);
  const session = await createSession(knex, user.id, meta);
  await audit(knex, { actorUserId: user.id, action: 'auth.sign_in', ip: meta.ip, userAgent: meta.userAgent, recordType: 'auth_session', recordId: session.id });
  return { user, session };
}
