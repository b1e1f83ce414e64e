import { describe, expect, it } from 'vitest';
import { fontRuns, plexFonts } from '../../../src/lib/reports/pdf-fonts';

// Two made-up fonts: one with ASCII letters and space, one with Polish letters only.
const ascii = { has: (cp: number) => cp >= 0x20 && cp < 0x7f };
const polish = { has: (cp: number) => [0x141, 0x142, 0x15a, 0x15b].includes(cp) };

describe('PDF font runs', () => {
  it('keeps a plain line in one run', () => {
    expect(fontRuns('Mean power 42 W', [ascii, polish])).toEqual([{ font: 0, text: 'Mean power 42 W' }]);
  });

  it('switches font only around the characters the first font lacks', () => {
    expect(fontRuns('Note by Łukasz', [ascii, polish])).toEqual([
      { font: 0, text: 'Note by ' },
      { font: 1, text: 'Ł' },
      { font: 0, text: 'ukasz' },
    ]);
  });

  it('writes a stand-in for characters no font has', () => {
    expect(fontRuns('40 → 45', [ascii, polish])).toEqual([{ font: 0, text: '40 to 45' }]);
    expect(fontRuns('a\u{1F600}b', [ascii, polish])).toEqual([{ font: 0, text: 'a?b' }]);
  });

  it('finds IBM Plex Sans in the shipped files: latin covers accents and the dash, latin-ext the Polish L', () => {
    const fonts = plexFonts().regular;
    expect(fontRuns('Tomás – 5 µs', fonts)).toEqual([{ font: 0, text: 'Tomás – 5 µs' }]);
    const runs = fontRuns('Łukasz', fonts);
    expect(runs.map((r) => r.text)).toEqual(['Ł', 'ukasz']);
    expect(runs[0].font).toBeGreaterThan(0);
  });
});
