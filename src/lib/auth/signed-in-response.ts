import type { AstroCookies } from 'astro';
import type { Knex } from 'knex';
import type { AuthSessionRow, UserRow } from '../db/tables';
import { json } from '../http/respond';
import { cookieOptions, SESSION_COOKIE, signSessionCookie } from './cookie';
import { homePath, loadRoles, meResponse } from './viewer';

/** The answer to a request that has just signed the user in: the session cookie, the user and where to go. */
export async function signedInResponse(
  knex: Knex,
  cookies: AstroCookies,
  { user, session }: { user: UserRow; session: AuthSessionRow },
): Promise<Response> {
  cookies.set(SESSION_COOKIE, await signSessionCookie(session.id, session.expires_at), cookieOptions(session.expires_at));
  const roles = await loadRoles(knex, user.id);
  const viewer = { userId: user.id, email: user.email, name: user.name, sessionId: session.id, ...roles };
  return json({ user: meResponse(viewer), home: homePath(roles) });
}
