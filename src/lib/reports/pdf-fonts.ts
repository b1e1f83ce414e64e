// IBM Plex Sans for PDFs, from the WOFF files @fontsource/ibm-plex-sans ships.
// pdfkit embeds WOFF through fontkit (WOFF is TrueType tables, each deflated);
// fontsource splits the family by script, so a text run is set in the first
// subset that has every glyph it needs, and a character no subset has is
// replaced with a near equivalent rather than printed as an empty box.
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import * as fontkit from 'fontkit';

const SUBSETS = ['latin', 'latin-ext', 'greek', 'cyrillic', 'cyrillic-ext', 'vietnamese'] as const;
export type Weight = 'regular' | 'semibold';
const WEIGHT_FILES: Record<Weight, string> = { regular: '400', semibold: '600' };

/** Replacements for characters no subset of the family carries. */
const STAND_INS: Record<string, string> = { '→': 'to', '≤': '<=', '≥': '>=', '\u2009': ' ', '\u202f': ' ' };

export interface PlexFont {
  name: string;
  data: Buffer;
  has: (codePoint: number) => boolean;
}

let loaded: Record<Weight, PlexFont[]> | null = null;

/** The subsets of each weight, latin first; read once per process. */
export function plexFonts(): Record<Weight, PlexFont[]> {
  if (loaded) return loaded;
  const require = createRequire(import.meta.url);
  const load = (weight: Weight): PlexFont[] =>
    SUBSETS.map((subset) => {
      const data = readFileSync(require.resolve(`@fontsource/ibm-plex-sans/files/ibm-plex-sans-${subset}-${WEIGHT_FILES[weight]}-normal.woff`));
      const font = fontkit.create(data) as fontkit.Font;
      const covered = new Set(font.characterSet);
      return { name: `plex-${weight}-${subset}`, data, has: (cp: number) => covered.has(cp) };
    });
  loaded = { regular: load('regular'), semibold: load('semibold') };
  return loaded;
}

export interface FontRun {
  font: number;
  text: string;
}

/**
 * Splits text into runs, each character set in the first font (in the given
 * order) that has it. The later subsets map some common characters (the space)
 * to glyphs they do not carry, so they are used only for what the earlier
 * fonts lack.
 */
export function fontRuns(text: string, fonts: { has: (codePoint: number) => boolean }[]): FontRun[] {
  const runs: FontRun[] = [];
  for (const raw of text) {
    const char = fonts.some((f) => f.has(raw.codePointAt(0)!)) ? raw : (STAND_INS[raw] ?? '?');
    for (const c of char) {
      const index = Math.max(0, fonts.findIndex((f) => f.has(c.codePointAt(0)!)));
      const last = runs[runs.length - 1];
      if (last && last.font === index) last.text += c;
      else runs.push({ font: index, text: c });
    }
  }
  return runs;
}
