import type { APIRoute } from 'astro';
import { audit } from '../lib/audit/audit';
import { SESSION_COOKIE } from '../lib/auth/cookie';
import { revokeSession } from '../lib/auth/sessions';
import { db } from '../lib/db/knex';

// The layout's sign-out button is a plain form, so it works before any script loads.
export const POST: APIRoute = async ({ locals, cookies, redirect }) => {
  const viewer = locals.viewer;
  if (viewer) {
    await revokeSession(db(), viewer.sessionId);
    await audit(db(), { actorUserId: viewer.userId, action: 'auth.sign_out', ip: locals.ip, userAgent: locals.userAgent, recordType: 'auth_session', recordId: viewer.sessionId });
  }
  cookies.delete(SESSION_COOKIE, { path: '/' });
  return redirect('/sign-in', 303);
};
