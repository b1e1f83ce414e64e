import { defineMiddleware } from 'astro:middleware';
import { DEVICE_COOKIE, readDeviceCookie, readSessionCookie, SESSION_COOKIE } from './lib/auth/cookie';
import { loadSession } from './lib/auth/sessions';
import { config } from './lib/config';
import { authDb } from './lib/data';
import { clientIp } from './lib/http/request';
import { errorResponse, json } from './lib/http/respond';
import { securityHeaders } from './lib/http/security-headers.mjs';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);
const PUBLIC_PAGES = [/^\/sign-in\/?$/, /^\/forgot-password\/?$/, /^\/reset\/[^/]+\/?$/, /^\/invite\/[^/]+\/?$/, /^\/unsubscribe\/[^/]+\/?$/];

// Astro's page policy forbids inline style attributes along with inline
// styles; two bars (progress, phase key) are sized and coloured by one.
// Scripts stay limited to Astro's hashes and the site's own files.
const STYLE_ATTRIBUTES = "style-src-attr 'unsafe-inline'";

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
  locals.device = await readDeviceCookie(cookies.get(DEVICE_COOKIE)?.value);

  const response = withMutableHeaders(await route());
  const page = response.headers.get('content-security-policy');
  for (const [k, v] of Object.entries(securityHeaders({ https: config().secureCookies }))) {
    if (!response.headers.has(k)) response.headers.set(k, v);
  }
  if (page && !page.includes('style-src-attr')) response.headers.set('content-security-policy', `${page.replace(/;?\s*$/, ';')} ${STYLE_ATTRIBUTES};`);
  // Nothing Kinloop renders is for a shared cache, least of all the pages that carry a token (invite, reset, unsubscribe).
  if (!response.headers.has('cache-control')) response.headers.set('cache-control', 'no-store');
  return response;

  async function route(): Promise<Response> {
    // Astro checks the origin of form posts only; this covers JSON requests too.
    if (!SAFE_METHODS.has(request.method)) {
      const origin = request.headers.get('origin');
      if (origin && !config().allowedOrigins.includes(origin)) {
        return json({ error: { code: 'bad_origin', message: 'This request came from another site and was refused.' } }, 403);
      }
    }

    const sessionId = await readSessionCookie(cookies.get(SESSION_COOKIE)?.value);
    try {
      locals.viewer = sessionId ? await loadSession(authDb(), sessionId) : null;
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
    return next();
  }
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
