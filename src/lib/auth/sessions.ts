import type { Db, Query } from '../data/db';
import { config } from '../config';
import type { AuthSessionRow, UserRow } from '../db/tables';
import { loadRoles, type Viewer } from './viewer';

// Writing last_seen_at on every request would turn reads into writes; a minute
// of slack is far below the idle limit.
const TOUCH_AFTER_MS = 60_000;

export async function createSession(
  knex: Db,
  userId: string,
  meta: { ip: string; userAgent: string | null },
): Promise<AuthSessionRow> {
  const expiresAt = new Date(Date.now() + config().sessionAbsoluteDays * 86_400_000);
  const [row] = await knex<AuthSessionRow>('auth_sessions')
    .insert({ user_id: userId, expires_at: expiresAt, ip: meta.ip, user_agent: meta.userAgent?.slice(0, 400) ?? null })
    .returning('*');
  return row;
}

/** The viewer for a session id, or null when the session is revoked, expired, idle too long or its user disabled. */
export async function loadSession(knex: Db, sessionId: string): Promise<Viewer | null> {
  if (!/^[0-9a-f-]{36}$/i.test(sessionId)) return null;
  const row: (AuthSessionRow & Pick<UserRow, 'email' | 'name' | 'disabled_at'>) | undefined = await knex('auth_sessions as s')
    .join('users as u', 'u.id', 's.user_id')
    .where('s.id', sessionId)
    .first('s.*', 'u.email', 'u.name', 'u.disabled_at');
  if (!row || row.revoked_at || row.disabled_at) return null;
  const now = Date.now();
  if (row.expires_at.getTime() <= now) return null;
  if (row.last_seen_at.getTime() + config().sessionIdleHours * 3_600_000 <= now) return null;
  if (now - row.last_seen_at.getTime() > TOUCH_AFTER_MS) {
    await knex('auth_sessions').where({ id: sessionId }).update({ last_seen_at: new Date(now) });
  }
  const roles = await loadRoles(knex, row.user_id);
  return { userId: row.user_id, email: row.email, name: row.name, sessionId, ...roles };
}

export async function revokeSession(knex: Db, sessionId: string): Promise<void> {
  await knex('auth_sessions').where({ id: sessionId }).whereNull('revoked_at').update({ revoked_at: knex.fn.now() });
}

export async function revokeUserSessions(knex: Db, userId: string, exceptSessionId?: string): Promise<void> {
  const q = knex('auth_sessions').where({ user_id: userId }).whereNull('revoked_at');
  if (exceptSessionId) q.whereNot({ id: exceptSessionId });
  await q.update({ revoked_at: knex.fn.now() });
}
