import type { AstroCookies } from 'astro';
import type { Db, Query } from '../data/db';
import type { AuthSessionRow, UserRow } from '../db/tables';
import { json } from '../http/respond';
import { setSignedInCookies, type TrustedDevice } from './cookie';
import { homePath, loadRoles, meResponse } from './viewer';

/** The answer to a request that has just signed the user in: the cookies, the user and where to go. */
export async function signedInResponse(
  knex: Db,
  cookies: AstroCookies,
  { user, session }: { user: UserRow; session: AuthSessionRow },
  device: TrustedDevice | null | undefined,
): Promise<Response> {
  await setSignedInCookies(cookies, user.id, session, device ?? null);
  const roles = await loadRoles(knex, user.id);
  const viewer = { userId: user.id, email: user.email, name: user.name, sessionId: session.id, ...roles };
  return json({ user: meResponse(viewer), home: homePath(roles) });
}
