import { readFileSync } from 'node:fs';

/**
 * Lato from the @fontsource/lato package (the screens' font, SIL Open Font License), read once. pdfkit's
 * fontkit reads WOFF and embeds the subset of glyphs a document uses. The "latin" subset covers Basic
 * Latin, Latin-1 and general punctuation (dashes, curly quotes, bullets, the minus sign); pdfText() maps
 * the few other characters our texts use.
 */
const FILES = {
  regular: '@fontsource/lato/files/lato-latin-400-normal.woff',
  bold: '@fontsource/lato/files/lato-latin-700-normal.woff',
} as const;

let loaded: { regular: Buffer; bold: Buffer } | null = null;

export function latoFonts(): { regular: Buffer; bold: Buffer } {
  loaded ??= {
    regular: readFileSync(require.resolve(FILES.regular)),
    bold: readFileSync(require.resolve(FILES.bold)),
  };
  return loaded;
}

const REPLACEMENTS: Record<string, string> = {
  '→': '->',
  '←': '<-',
  '≤': '<=',
  '≥': '>=',
  '≈': '~',
  '✓': 'x',
};
/** What Lato's latin subset draws (its unicode-range, per the package's CSS). */
const DRAWABLE =
  /[\n\t\u0020-\u00ff\u0131\u0152\u0153\u02bb\u02bc\u02c6\u02da\u02dc\u2000-\u206f\u20ac\u2122\u2191\u2193\u2212\u2215]/u;

/** Text safe to draw with the embedded subset: known look-alikes for the rest, '?' for anything else. */
export function pdfText(s: string): string {
  let out = '';
  for (const ch of s) out += DRAWABLE.test(ch) ? ch : (REPLACEMENTS[ch] ?? '?');
  return out;
}
