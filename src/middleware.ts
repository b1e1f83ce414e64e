import { defineMiddleware } from 'astro:middleware';
import { readSessionCookie, SESSION_COOKIE } from './lib/auth/cookie';
import { loadSession } from './lib/auth/sessions';
import { config } from './lib/config';
import { db } from './lib/db/knex';
import { clientIp } from './lib/http/request';
import { errorResponse, json } from './lib/http/respond';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
const PUBLIC_PAGES = [/^\/sign-in\/?$/, /^\/forgot-password\/?$/, /^\/reset\/[^/]+\/?$/, /^\/invite\/[^/]+\/?$/, /^\/unsubscribe\/[^/]+\/?$/];

const SECURITY_HEADERS: Record<string, string> = {
  'x-content-type-options': 'nosniff',
  'referrer-policy': 'same-origin',
  'x-frame-options': 'DENY',
  'permissions-policy': 'camera=(), microphone=(), geolocation=()',
  'content-security-policy':
    "default-src 'self'; script-src 'self' 'unsafe-inline'; style-src 'self' 'unsafe-inline'; img-src 'self' data: blob:; font-src 'self'; connect-src 'self'; frame-ancestors 'none'; form-action 'self'; base-uri 'self'; object-src 'none'",
};

export const onRequest = defineMiddleware(async (context, next) => {
  const { request, url, cookies, locals } = context;
  let socketAddress: string | undefined;
  try {
    socketAddress = context.clientAddress;
  } catch {
    socketAddress = undefined;
  }
  locals.ip = clientIp(request, socketAddress);
  locals.userAgent = request.headers.get('user-agent');

  // Astro checks the origin of form posts only; this covers JSON requests too.
  if (!SAFE_METHODS.has(request.method)) {
    const origin = request.headers.get('origin');
    if (origin && !config().allowedOrigins.includes(origin)) {
      return json({ error: { code: 'bad_origin', message: 'This request came from another site and was refused.' } }, 403);
    }
  }

  const sessionId = await readSessionCookie(cookies.get(SESSION_COOKIE)?.value);
  try {
    locals.viewer = sessionId ? await loadSession(db(), sessionId) : null;
  } catch (err) {
    // The database is away: a 503 that says so, not a crash page.
    return errorResponse(err);
  }
  if (sessionId && !locals.viewer) cookies.delete(SESSION_COOKIE, { path: '/' });

  const isApi = url.pathname.startsWith('/api/');
  if (!isApi && !locals.viewer && !PUBLIC_PAGES.some((p) => p.test(url.pathname))) {
    const target = url.pathname === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(url.pathname + url.search)}`;
    return context.redirect(target, 302);
  }

  const response = withMutableHeaders(await next());
  for (const [k, v] of Object.entries(SECURITY_HEADERS)) {
    if (!response.headers.has(k)) response.headers.set(k, v);
  }
  if ((locals.viewer || isApi) && !response.headers.has('cache-control')) response.headers.set('cache-control', 'no-store');
  return response;
});

/** Redirects made with Response.redirect() have immutable headers. */
function withMutableHeaders(response: Response): Response {
  try {
    response.headers.set('x-kinloop', '1');
    response.headers.delete('x-kinloop');
    return response;
  } catch {
    return new Response(response.body, response);
  }
}
