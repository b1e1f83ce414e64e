import type { APIRoute } from 'astro';
import { SESSION_COOKIE } from '../lib/auth/cookie';
import { signedIn } from '../lib/auth/context';
import { revokeSession } from '../lib/auth/sessions';
import { scope } from '../lib/data';

// The layout's sign-out button is a plain form, so it works before any script loads.
export const POST: APIRoute = async ({ locals, cookies, redirect }) => {
  if (locals.viewer) {
    const ctx = signedIn(locals);
    const s = scope(ctx);
    await revokeSession(s.own().db, ctx.viewer.sessionId);
    await s.audit({ action: 'auth.sign_out', recordType: 'auth_session', recordId: ctx.viewer.sessionId });
  }
  cookies.delete(SESSION_COOKIE, { path: '/' });
  return redirect('/sign-in', 303);
};
