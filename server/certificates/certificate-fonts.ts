/**
 * The certificate's typefaces: Source Serif 4 for headings, IBM Plex Sans for
 * text, IBM Plex Mono for numerals, all from the @fontsource packages as
 * .woff (pdfkit's subsetter crashes on .woff2 with non-ASCII text), unpacked
 * to plain TrueType first (see sfnt-from-woff.ts). Each face
 * ships split into a "latin" and a "latin-ext" file; text is cut into runs so
 * every character is drawn from a file that holds its glyph.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { sfntFromWoff } from './sfnt-from-woff';

export type CertificateFontFamily = 'serif' | 'sans' | 'mono';
export type CertificateFontWeight = 400 | 600;

interface FontkitFont {
  hasGlyphForCodePoint(codePoint: number): boolean;
  ascent: number;
  unitsPerEm: number;
}

interface FontFile {
  /** Name under which the file is registered with pdfkit. */
  name: string;
  data: Buffer;
  font: FontkitFont;
}

export interface FontRun {
  fontName: string;
  text: string;
}

const packageOf: Record<CertificateFontFamily, string> = {
  serif: 'source-serif-4',
  sans: 'ibm-plex-sans',
  mono: 'ibm-plex-mono',
};
const families: CertificateFontFamily[] = ['serif', 'sans', 'mono'];
const weights: CertificateFontWeight[] = [400, 600];

let loaded: Map<string, [FontFile, FontFile]> | null = null;

function fontKey(family: CertificateFontFamily, weight: CertificateFontWeight): string {
  return `${family}-${weight}`;
}

function loadFontFiles(): Map<string, [FontFile, FontFile]> {
  if (loaded) return loaded;
  const require = createRequire(import.meta.url);
  // fontkit is pdfkit's own dependency: resolve it from pdfkit so both read fonts the same way.
  const fontkit = createRequire(require.resolve('pdfkit'))('fontkit') as { create(data: Buffer): FontkitFont };
  const files = new Map<string, [FontFile, FontFile]>();
  for (const family of families) {
    const folder = path.join(path.dirname(require.resolve(`@fontsource/${packageOf[family]}/LICENSE`)), 'files');
    for (const weight of weights) {
      const pair = (['latin', 'latin-ext'] as const).map((subset) => {
        const data = sfntFromWoff(readFileSync(path.join(folder, `${packageOf[family]}-${subset}-${weight}-normal.woff`)));
        return { name: `${fontKey(family, weight)}-${subset}`, data, font: fontkit.create(data) };
      }) as [FontFile, FontFile];
      files.set(fontKey(family, weight), pair);
    }
  }
  loaded = files;
  return files;
}

/** Registers every face with a pdfkit document under the names used by fontRuns(). */
export function registerCertificateFonts(doc: PDFKit.PDFDocument): void {
  for (const pair of loadFontFiles().values()) {
    for (const file of pair) doc.registerFont(file.name, file.data);
  }
}

/** Height of the face's ascender as a fraction of the font size (hhea ascent, as pdfkit places a line's top). */
export function fontAscender(family: CertificateFontFamily, weight: CertificateFontWeight): number {
  const { font } = loadFontFiles().get(fontKey(family, weight))![0];
  return font.ascent / font.unitsPerEm;
}

/** Cuts text into runs, each drawn from the first file of the face that holds its characters. */
export function fontRuns(text: string, family: CertificateFontFamily, weight: CertificateFontWeight): FontRun[] {
  const pair = loadFontFiles().get(fontKey(family, weight))!;
  const runs: FontRun[] = [];
  for (const character of text) {
    const codePoint = character.codePointAt(0)!;
    const file = !pair[0].font.hasGlyphForCodePoint(codePoint) && pair[1].font.hasGlyphForCodePoint(codePoint) ? pair[1] : pair[0];
    const last = runs[runs.length - 1];
    if (last && last.fontName === file.name) last.text += character;
    else runs.push({ fontName: file.name, text: character });
  }
  return runs;
}

/** Characters of the text that at least one certificate face cannot draw (control characters included). */
export function unprintableCharacters(text: string): string[] {
  const files = loadFontFiles();
  const missing = new Set<string>();
  for (const character of text) {
    const codePoint = character.codePointAt(0)!;
    for (const pair of files.values()) {
      if (!pair[0].font.hasGlyphForCodePoint(codePoint) && !pair[1].font.hasGlyphForCodePoint(codePoint)) {
        missing.add(character);
        break;
      }
    }
  }
  return [...missing];
}
