import type { Db, Query } from '../data/db';
import { z } from 'zod';
import { audit } from '../audit/audit';
import type { AuthSessionRow, UserRow } from '../db/tables';
import { HttpError } from '../http/errors';
import type { TrustedDevice } from './cookie';
import { decoyHash, verifyPassword } from './password';
import { markSignInSucceeded, reserveSignInAttempt, waitWords } from './rate-limit';
import { createSession } from './sessions';
import { line } from '../validation/fields';

export interface RequestMeta {
  ip: string;
  userAgent: string | null;
  /** The trusted-device cookie the request carried, if any (set by the middleware). */
  device?: TrustedDevice | null;
}

export const signInInputSchema = z.object({
  email: line(z.string({ invalid_type_error: 'Enter your e-mail address.' }).trim().min(1, 'Enter your e-mail address.').max(254, 'An e-mail address is at most 254 characters.'), 'E-mail'),
  password: z.string({ invalid_type_error: 'Enter your password.' }).min(1, 'Enter your password.').max(200, 'A password is at most 200 characters.'),
});

const BAD_CREDENTIALS = 'That e-mail and password do not match an active account. Check both and try again, or reset your password.';

export function normaliseEmail(email: string): string {
  return email.trim().toLowerCase();
}

export async function findUserByEmail(knex: Db, email: string): Promise<UserRow | undefined> {
  return knex<UserRow>('users').whereRaw('lower(email) = ?', [normaliseEmail(email)]).first();
}

/**
 * Checks an e-mail and password under the sign-in limits: every check, on the
 * sign-in form or when accepting an invitation with an existing account's
 * password, is one attempt. Returns the active user, or throws 429 (limited)
 * or 401 (`wrongMessage`).
 */
export async function checkPassword(
  knex: Db,
  input: { email: string; password: string },
  meta: RequestMeta,
  { via, wrongMessage = BAD_CREDENTIALS }: { via: 'sign-in' | 'invitation'; wrongMessage?: string },
): Promise<UserRow> {
  const email = normaliseEmail(input.email);
  const user = await findUserByEmail(knex, email);
  const device = user && meta.device?.userId === user.id ? meta.device.deviceId : null;
  const reservation = await reserveSignInAttempt(knex, { email, ip: meta.ip, device });
  if (!reservation.ok) {
    await audit(knex, { actorUserId: null, action: 'auth.sign_in_blocked', ip: meta.ip, userAgent: meta.userAgent, detail: { email, via, limit: reservation.limit } });
    throw new HttpError(
      429,
      'too_many_attempts',
      `Too many sign-in attempts. For your security, try again in ${waitWords(reservation.retryAfterS)}, or reset your password.`,
      { retryAfterSeconds: reservation.retryAfterS },
      { 'retry-after': String(reservation.retryAfterS) },
    );
  }
  const matches = user
    ? await verifyPassword(user.password_hash, input.password)
    : await verifyPassword(await decoyHash(), input.password).then(() => false);
  if (!user || !matches || user.disabled_at) {
    await audit(knex, {
      actorUserId: user?.id ?? null,
      action: 'auth.sign_in_failed',
      ip: meta.ip,
      userAgent: meta.userAgent,
      detail: { email, via, reason: !user ? 'unknown_email' : user.disabled_at ? 'disabled' : 'wrong_password' },
    });
    throw new HttpError(401, 'bad_credentials', wrongMessage);
  }
  await markSignInSucceeded(knex, reservation.id);
  return user;
}

export async function signIn(
  knex: Db,
  input: { email: string; password: string },
  meta: RequestMeta,
): Promise<{ user: UserRow; session: AuthSessionRow }> {
  const user = await checkPassword(knex, input, meta, { via: 'sign-in' });
  const session = await createSession(knex, user.id, meta);
  await audit(knex, { actorUserId: user.id, action: 'auth.sign_in', ip: meta.ip, userAgent: meta.userAgent, recordType: 'auth_session', recordId: session.id });
  return { user, session };
}
