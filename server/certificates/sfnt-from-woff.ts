/**
 * Unpacks a WOFF 1.0 font (W3C Recommendation "WOFF File Format 1.0", §3–§5)
 * into the plain TrueType/OpenType file it wraps: each table is zlib-inflated
 * when stored compressed and laid out 4-byte aligned after a rebuilt table
 * directory.
 *
 * Why: fontkit 2.0.4 (pdfkit's font engine) reads a glyph header even for an
 * empty glyph such as the space (foliojs/fontkit issue #378); in the WOFF
 * files of IBM Plex Mono and the latin-ext subsets that read runs off the end
 * of the decompressed glyf table and throws. In the unpacked file the read
 * lands on the next table's bytes, and trailing zero padding covers the case
 * where glyf is the last table; the empty glyph's box is never drawn.
 */
import { inflateSync } from 'node:zlib';
import { invariant } from '../invariant';

const WOFF_SIGNATURE = 0x774f4646; // 'wOFF'
const WOFF_HEADER_BYTES = 44;
const WOFF_TABLE_ENTRY_BYTES = 20;
const SFNT_TABLE_ENTRY_BYTES = 16;
const TRAILING_PADDING_BYTES = 16;

export function sfntFromWoff(woff: Buffer): Buffer {
  invariant(woff.length >= WOFF_HEADER_BYTES && woff.readUInt32BE(0) === WOFF_SIGNATURE, 'sfntFromWoff was given a file that is not WOFF 1.0');
  const flavor = woff.readUInt32BE(4);
  const tableCount = woff.readUInt16BE(12);
  const totalSfntSize = woff.readUInt32BE(16);

  const tables = Array.from({ length: tableCount }, (_, i) => {
    const entry = WOFF_HEADER_BYTES + i * WOFF_TABLE_ENTRY_BYTES;
    const tag = woff.readUInt32BE(entry);
    const offset = woff.readUInt32BE(entry + 4);
    const compressedLength = woff.readUInt32BE(entry + 8);
    const originalLength = woff.readUInt32BE(entry + 12);
    const checksum = woff.readUInt32BE(entry + 16);
    const stored = woff.subarray(offset, offset + compressedLength);
    const data = compressedLength < originalLength ? inflateSync(stored) : stored;
    invariant(data.length === originalLength, `WOFF table ${i} unpacked to ${data.length} bytes, its directory says ${originalLength}`);
    return { tag, checksum, data };
  });

  const entrySelector = Math.floor(Math.log2(tableCount));
  const searchRange = 2 ** entrySelector * SFNT_TABLE_ENTRY_BYTES;
  const directoryBytes = 12 + SFNT_TABLE_ENTRY_BYTES * tableCount;
  const sfntBytes = directoryBytes + tables.reduce((sum, t) => sum + ((t.data.length + 3) & ~3), 0);
  invariant(sfntBytes === totalSfntSize, `unpacked font is ${sfntBytes} bytes, the WOFF header says ${totalSfntSize}`);

  const sfnt = Buffer.alloc(sfntBytes + TRAILING_PADDING_BYTES);
  sfnt.writeUInt32BE(flavor, 0);
  sfnt.writeUInt16BE(tableCount, 4);
  sfnt.writeUInt16BE(searchRange, 6);
  sfnt.writeUInt16BE(entrySelector, 8);
  sfnt.writeUInt16BE(tableCount * SFNT_TABLE_ENTRY_BYTES - searchRange, 10);
  let offset = directoryBytes;
  tables.forEach((table, i) => {
    const entry = 12 + i * SFNT_TABLE_ENTRY_BYTES;
    sfnt.writeUInt32BE(table.tag, entry);
    sfnt.writeUInt32BE(table.checksum, entry + 4);
    sfnt.writeUInt32BE(offset, entry + 8);
    sfnt.writeUInt32BE(table.data.length, entry + 12);
    table.data.copy(sfnt, offset);
    offset += (table.data.length + 3) & ~3;
  });
  return sfnt;
}
