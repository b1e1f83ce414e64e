// File names as uploaders' devices send them: kept as text people can read,
// with nothing that changes how the text around them shows (control
// characters, bidirectional overrides) and nothing that breaks a header.

// C0 and C1 controls, DEL, and the Unicode format characters that reorder or
// hide text: bidi marks, embeddings, overrides and isolates, zero-width characters, BOM.
const INVISIBLE = /[\u0000-\u001f\u007f-\u009f\u061c\u200b-\u200f\u202a-\u202e\u2060-\u2064\u2066-\u2069\ufeff]/gu;
const MAX_NAME_LENGTH = 255;
const FALLBACK_NAME = 'ride.csv';

/** The name to store and show for an uploaded file. */
export function cleanFileName(raw: string | undefined | null): string {
  const text = (raw ?? '').normalize('NFC').replace(INVISIBLE, '');
  // Some browsers send a whole path; the file's own name is after the last separator.
  const base = text.slice(Math.max(text.lastIndexOf('/'), text.lastIndexOf('\\')) + 1).trim();
  const name = Array.from(base).slice(0, MAX_NAME_LENGTH).join('');
  return name === '' ? FALLBACK_NAME : name;
}

// RFC 5987 attr-char: letters, digits and !#$&+-.^_`|~; everything else is percent-encoded.
const encodeAttr = (s: string) => encodeURIComponent(s).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);

/**
 * A Content-Disposition for downloading a file under its name (RFC 6266): a
 * plain ASCII `filename` for old clients, and the exact name in
 * `filename*=UTF-8''…`. Header values must be Latin-1; this one is ASCII.
 */
export function attachmentDisposition(name: string): string {
  const clean = cleanFileName(name);
  const ascii = clean
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^\x20-\x7e]/g, '_')
    .replace(/["\\%]/g, '_');
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeAttr(clean)}`;
}
