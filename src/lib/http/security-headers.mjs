// The security headers of every answer: pages, API, redirects, static files
// and error pages. Plain JavaScript so that scripts/serve.mjs (plain Node,
// in front of the built server) and the Astro middleware share one list.

// Pages carry Astro's own policy instead (hashes of the scripts and styles it
// emitted, directives from astro.config.mjs); this one is for everything that
// is not a page: it lets nothing load and nothing frame it.
export const NON_PAGE_CSP = "default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'";

/**
 * @param {{ https: boolean }} site `https` when PUBLIC_URL is https: browsers then keep to https for a year.
 * @returns {Record<string, string>}
 */
export function securityHeaders({ https }) {
  return {
    'x-content-type-options': 'nosniff',
    'referrer-policy': 'same-origin',
    'x-frame-options': 'DENY',
    'permissions-policy': 'camera=(), microphone=(), geolocation=()',
    'cross-origin-opener-policy': 'same-origin',
    'content-security-policy': NON_PAGE_CSP,
    ...(https ? { 'strict-transport-security': 'max-age=31536000; includeSubDomains' } : {}),
  };
}
