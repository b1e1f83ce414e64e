import type { APIRoute } from 'astro';
import { audit } from '../../../lib/audit/audit';
import { SESSION_COOKIE } from '../../../lib/auth/cookie';
import { signedIn } from '../../../lib/auth/context';
import { revokeSession } from '../../../lib/auth/sessions';
import { handle, json } from '../../../lib/http/respond';

export const POST: APIRoute = ({ locals, cookies }) =>
  handle(async () => {
    const ctx = signedIn(locals);
    await revokeSession(ctx.knex, ctx.viewer.sessionId);
    await audit(ctx.knex, { actorUserId: ctx.viewer.userId, action: 'auth.sign_out', ip: ctx.ip, userAgent: ctx.userAgent, recordType: 'auth_session', recordId: ctx.viewer.sessionId });
    cookies.delete(SESSION_COOKIE, { path: '/' });
    return json({ signedOut: true });
  });
