// File names as stored and as sent back in Content-Disposition. Expected
// values are worked by hand: UTF-8 bytes from the Unicode code charts
// (ü U+00FC = C3 BC, 日 U+65E5 = E6 97 A5, 本 U+672C = E6 9C AC), the
// percent-encoding of RFC 5987's attr-char rule (source: RFC 5987 §3.2.1).
import { describe, expect, it } from 'vitest';
import { attachmentDisposition, cleanFileName } from '../../../src/lib/ingest/file-name';

describe('cleanFileName', () => {
  it('keeps a name people wrote, in composed form', () => {
    expect(cleanFileName('Fahrt Mu\u0308ller.csv')).toBe('Fahrt Müller.csv');
    expect(cleanFileName('日本 ride.csv')).toBe('日本 ride.csv');
  });

  it('removes control characters and the characters that reorder or hide text', () => {
    expect(cleanFileName('ride\u0000\u0007\u001b.csv')).toBe('ride.csv');
    expect(cleanFileName('invoice\u202Evsc.csv')).toBe('invoicevsc.csv');
    expect(cleanFileName('a\u2066b\u2069c\u200Fd\u061C.csv')).toBe('abcd.csv');
    expect(cleanFileName('\uFEFFride\u200B.csv')).toBe('ride.csv');
  });

  it('keeps only the last part of a path and names an empty name ride.csv', () => {
    expect(cleanFileName('C:\\Users\\carer\\ride.csv')).toBe('ride.csv');
    expect(cleanFileName('../../etc/passwd')).toBe('passwd');
    expect(cleanFileName('\u0000\u202E  ')).toBe('ride.csv');
    expect(cleanFileName(undefined)).toBe('ride.csv');
  });

  it('keeps at most 255 characters', () => {
    expect(cleanFileName('é'.repeat(300))).toBe('é'.repeat(255));
  });
});

describe('attachmentDisposition', () => {
  it('gives an ASCII filename for old clients and the exact name as UTF-8 in filename*', () => {
    expect(attachmentDisposition('Müller 日本.csv')).toBe(`attachment; filename="Muller __.csv"; filename*=UTF-8''M%C3%BCller%20%E6%97%A5%E6%9C%AC.csv`);
  });

  it('escapes what would end or bend the quoted filename, and encodes characters outside attr-char', () => {
    expect(attachmentDisposition('a"b%.csv')).toBe(`attachment; filename="a_b_.csv"; filename*=UTF-8''a%22b%25.csv`);
    expect(attachmentDisposition("it's (1)*.csv")).toBe(`attachment; filename="it's (1)*.csv"; filename*=UTF-8''it%27s%20%281%29%2A.csv`);
  });

  it('is a valid header value (Latin-1 only) for any stored name', () => {
    for (const name of ['日本.csv', 'ride\u202E.csv', '\u0000', 'x\r\ny.csv']) {
      expect(() => new Headers({ 'content-disposition': attachmentDisposition(name) })).not.toThrow();
    }
  });
});
