// Where to go after signing in: only a path of this site, never another site.
// Browsers drop tabs and line breaks inside URLs and read `\` as `/`, so
// "/\t/evil.example" or "/\\evil.example" would leave the site; a line break
// in a Location header is refused by the server. The value is decided by
// parsing it as a URL against the site's own address, and only what that
// parse produced is returned.

const MAX_LENGTH = 2000;

/**
 * The same-origin path (with query and fragment) that `next` names, or null.
 * `base` is the site's own address: PUBLIC_URL on the server, the page's
 * origin in the browser.
 */
export function safeNext(next: string | null | undefined, base: string): string | null {
  if (!next || next.length > MAX_LENGTH) return null;
  if (!next.startsWith('/') || next.includes('//') || next.includes('\\')) return null;
  // Control characters (C0, DEL, C1) are never part of a path we link to.
  if (/[\u0000-\u001f\u007f-\u009f]/.test(next)) return null;
  let url: URL;
  let origin: string;
  try {
    origin = new URL(base).origin;
    url = new URL(next, origin);
  } catch {
    return null;
  }
  if (url.origin !== origin || url.username || url.password) return null;
  const path = `${url.pathname}${url.search}${url.hash}`;
  return path.startsWith('/') && !path.startsWith('//') ? path : null;
}
