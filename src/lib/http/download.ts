// Files that leave Kinloop: a download answer with a name that survives every
// browser (an ASCII fallback plus the RFC 5987 UTF-8 name) and is never cached.

/** "Noor Haddad" → "noor-haddad"; letters outside ASCII lose their accents or go. */
export function fileSlug(text: string): string {
  return (
    text
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 60) || 'client'
  );
}

export function download(body: BodyInit, filename: string, contentType: string): Response {
  const ascii = filename.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
  return new Response(body, {
    status: 200,
    headers: {
      'content-type': contentType,
      'content-disposition': `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(filename)}`,
      'cache-control': 'no-store',
      'x-content-type-options': 'nosniff',
    },
  });
}
