// Two helpers of the scale tools: COPY's text format, and the page-weight
// walk through a page's module graph.
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { afterAll, describe, expect, it } from 'vitest';
import { copyCell } from '../../../scripts/lib/scale/copy';
import { pageWeight } from '../../../scripts/lib/page-weight.mjs';

describe('copyCell', () => {
  // source: PostgreSQL documentation, COPY, "Text Format" (\N, backslash escapes; bytea hex input \x…)
  it('writes values the way COPY … FROM STDIN (text) reads them', () => {
    expect(copyCell(null)).toBe('\\N');
    expect(copyCell(undefined)).toBe('\\N');
    expect(copyCell(Number.NaN)).toBe('\\N');
    expect(copyCell(12.5)).toBe('12.5');
    expect(copyCell(true)).toBe('t');
    expect(copyCell('tab\there, new\nline, back\\slash')).toBe('tab\\there, new\\nline, back\\\\slash');
    expect(copyCell(new Date('2026-03-01T10:00:00Z'))).toBe('2026-03-01T10:00:00.000Z');
    expect(copyCell(new Uint8Array([0, 171, 255]))).toBe('\\\\x00abff');
    // JSON's own backslash (before the quote) is escaped once more for COPY.
    expect(copyCell({ a: 'x"y' })).toBe('{"a":"x\\\\"y"}');
  });
});

describe('pageWeight', () => {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'weight-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  const file = (name: string, text: string) => {
    mkdirSync(path.dirname(path.join(dir, name)), { recursive: true });
    writeFileSync(path.join(dir, name), text);
    return gzipSync(Buffer.from(text)).length;
  };

  it('counts the islands and what they import at once, and keeps import() apart', async () => {
    const island = file('_astro/Island.js', 'import{a}from"./shared.js";export default function I(){return import("./Chart.js")}');
    const shared = file('_astro/shared.js', 'export const a=1;');
    const renderer = file('_astro/client.js', 'import"./shared.js";export default 1;');
    const chart = file('_astro/Chart.js', 'import"./chart-lib.js";export const c=2;');
    const chartLib = file('_astro/chart-lib.js', 'export const lib=3;'.repeat(20));
    file('_astro/unused.js', 'export const never=4;');
    const html = `<html><head><link rel="modulepreload" href="/_astro/shared.js"></head><body>
      <astro-island uid="1" component-url="/_astro/Island.js" renderer-url="/_astro/client.js" props="{}"></astro-island>
      <script type="application/json">{"not":"code"}</script></body></html>`;
    const w = await pageWeight(html, dir);
    expect(w.files.sort()).toEqual(['/_astro/Island.js', '/_astro/client.js', '/_astro/shared.js']);
    expect(w.onLoad.gzip).toBe(island + shared + renderer);
    expect(w.lazyFiles.sort()).toEqual(['/_astro/Chart.js', '/_astro/chart-lib.js']);
    expect(w.lazy.gzip).toBe(chart + chartLib);
    expect(w.inline.raw).toBe(0);
  });
});
