// Bytes → text. A byte-order mark decides (UTF-8, UTF-16 LE/BE); without one
// the bytes are UTF-8 when they are valid UTF-8, else Windows-1252 (which the
// WHATWG decoder also uses for "Latin-1").

export type Encoding = 'utf-8' | 'utf-8-bom' | 'utf-16le' | 'utf-16be' | 'windows-1252';

export interface Decoded {
  text: string;
  encoding: Encoding;
}

export function decodeBytes(bytes: Uint8Array): Decoded {
  const [b0, b1, b2] = bytes;
  if (b0 === 0xef && b1 === 0xbb && b2 === 0xbf) {
    return { text: new TextDecoder('utf-8').decode(bytes), encoding: 'utf-8-bom' };
  }
  if (b0 === 0xff && b1 === 0xfe) return { text: new TextDecoder('utf-16le').decode(bytes), encoding: 'utf-16le' };
  if (b0 === 0xfe && b1 === 0xff) return { text: new TextDecoder('utf-16be').decode(bytes), encoding: 'utf-16be' };
  try {
    return { text: new TextDecoder('utf-8', { fatal: true }).decode(bytes), encoding: 'utf-8' };
  } catch {
    return { text: new TextDecoder('windows-1252').decode(bytes), encoding: 'windows-1252' };
  }
}

// Control characters that do not occur in text files (tab, line feed, form
// feed and carriage return do); C1 controls come from stray bytes in Windows-1252.
const CONTROL = /[\u0000-\u0008\u000b\u000e-\u001f\u007f-\u009f]/;
const MAX_CONTROL_SHARE = 0.01;

/** False for binary content: any NUL, or more than 1 % control characters. */
export function looksLikeText(text: string): boolean {
  if (!CONTROL.test(text)) return true;
  if (text.includes('\u0000')) return false;
  let controls = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c < 9 || c === 11 || (c >= 14 && c < 32) || (c >= 0x7f && c <= 0x9f)) controls++;
  }
  return controls <= text.length * MAX_CONTROL_SHARE;
}
