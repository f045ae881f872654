import { readFileSync, readdirSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { sfntFromWoff } from '../../server/certificates/sfnt-from-woff';

const require = createRequire(import.meta.url);
// fontkit, the font engine pdfkit itself uses, is the reference reader here.
const fontkit = createRequire(require.resolve('pdfkit'))('fontkit') as {
  create(data: Buffer): {
    numGlyphs: number;
    characterSet: number[];
    postscriptName: string;
    glyphForCodePoint(codePoint: number): { advanceWidth: number };
    hasGlyphForCodePoint(codePoint: number): boolean;
  };
};

const woffFiles = ['source-serif-4', 'ibm-plex-sans', 'ibm-plex-mono'].flatMap((family) => {
  const folder = path.join(path.dirname(require.resolve(`@fontsource/${family}/LICENSE`)), 'files');
  return readdirSync(folder)
    .filter((f) => /-latin(-ext)?-(400|600)-normal\.woff$/.test(f))
    .map((f) => path.join(folder, f));
});

/** OpenType table checksum: the sum of the table's big-endian uint32 words, zero-padded (OpenType spec, "Calculating checksums"). */
function tableChecksum(table: Buffer): number {
  const padded = Buffer.concat([table, Buffer.alloc((4 - (table.length % 4)) % 4)]);
  let sum = 0;
  for (let i = 0; i < padded.length; i += 4) sum = (sum + padded.readUInt32BE(i)) >>> 0;
  return sum;
}

describe('sfntFromWoff', () => {
  it('finds the twelve certificate font files', () => {
    expect(woffFiles).toHaveLength(12);
  });

  it.each(woffFiles.map((f) => [path.basename(f), f]))('sfntFromWoff unpacks %s into tables whose checksums match the directory', (_name, file) => {
    const sfnt = sfntFromWoff(readFileSync(file));
    const tableCount = sfnt.readUInt16BE(4);
    for (let i = 0; i < tableCount; i += 1) {
      const entry = 12 + 16 * i;
      const tag = sfnt.toString('latin1', entry, entry + 4);
      const offset = sfnt.readUInt32BE(entry + 8);
      const length = sfnt.readUInt32BE(entry + 12);
      const table = Buffer.from(sfnt.subarray(offset, offset + length));
      // The head table's checksum is taken with checkSumAdjustment (bytes 8–11) set to zero.
      if (tag === 'head') table.writeUInt32BE(0, 8);
      expect(tableChecksum(table), tag).toBe(sfnt.readUInt32BE(entry + 4));
    }
  });

  it.each(woffFiles.map((f) => [path.basename(f), f]))('fontkit reads the same glyphs from %s before and after unpacking', (_name, file) => {
    const woff = readFileSync(file);
    const fromWoff = fontkit.create(woff);
    const fromSfnt = fontkit.create(sfntFromWoff(woff));
    expect(fromSfnt.postscriptName).toBe(fromWoff.postscriptName);
    expect(fromSfnt.numGlyphs).toBe(fromWoff.numGlyphs);
    expect(fromSfnt.characterSet).toEqual(fromWoff.characterSet);
    for (const character of 'Hf0°±µ Łę') {
      const codePoint = character.codePointAt(0)!;
      if (fromSfnt.hasGlyphForCodePoint(codePoint)) expect(fromSfnt.glyphForCodePoint(codePoint).advanceWidth).toBeGreaterThan(0);
    }
  });

  it('fontkit measures the same advance widths from a WOFF it can read and from its unpacked copy', () => {
    // IBM Plex Sans latin 400 is one of the WOFF files fontkit 2.0.4 reads without error.
    const file = woffFiles.find((f) => f.endsWith('ibm-plex-sans-latin-400-normal.woff'))!;
    const woff = readFileSync(file);
    const fromWoff = fontkit.create(woff);
    const fromSfnt = fontkit.create(sfntFromWoff(woff));
    for (const character of 'Calibration certificate 0123456789 mm °C ±') {
      const codePoint = character.codePointAt(0)!;
      expect(fromSfnt.glyphForCodePoint(codePoint).advanceWidth).toBe(fromWoff.glyphForCodePoint(codePoint).advanceWidth);
    }
  });

  it('sfntFromWoff refuses a file that is not WOFF', () => {
    expect(() => sfntFromWoff(Buffer.from('not a font at all, just some bytes here to read past the header length'))).toThrow(
      'Invariant failed: sfntFromWoff was given a file that is not WOFF 1.0',
    );
  });
});
