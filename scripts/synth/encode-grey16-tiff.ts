/**
 * A minimal baseline TIFF 6.0 writer for 16-bit greyscale: little-endian
 * header, one IFD, one uncompressed strip. sharp writes 8-bit TIFF only here,
 * hence our own (tag numbers and layout from the TIFF 6.0 specification,
 * Adobe 1992, Part 1 "Baseline TIFF").
 */
const SHORT = 3;
const LONG = 4;
const RATIONAL = 5;

export function encodeGrey16Tiff(options: { pixels: Uint16Array; widthPx: number; heightPx: number }): Buffer {
  const { pixels, widthPx, heightPx } = options;
  if (pixels.length !== widthPx * heightPx) {
    throw new Error(`invariant: ${pixels.length} pixels given for a ${widthPx}×${heightPx} image`);
  }
  const stripBytes = widthPx * heightPx * 2;
  const entries: Array<[tag: number, type: number, value: number]> = [];
  const entryCount = 14;
  const ifdOffset = 8;
  const ifdBytes = 2 + entryCount * 12 + 4;
  const xResolutionOffset = ifdOffset + ifdBytes;
  const yResolutionOffset = xResolutionOffset + 8;
  const stripOffset = yResolutionOffset + 8;
  entries.push(
    [256, LONG, widthPx], // ImageWidth
    [257, LONG, heightPx], // ImageLength
    [258, SHORT, 16], // BitsPerSample
    [259, SHORT, 1], // Compression: none
    [262, SHORT, 1], // PhotometricInterpretation: BlackIsZero
    [273, LONG, stripOffset], // StripOffsets
    [277, SHORT, 1], // SamplesPerPixel
    [278, LONG, heightPx], // RowsPerStrip
    [279, LONG, stripBytes], // StripByteCounts
    [282, RATIONAL, xResolutionOffset], // XResolution
    [283, RATIONAL, yResolutionOffset], // YResolution
    [284, SHORT, 1], // PlanarConfiguration: chunky
    [296, SHORT, 1], // ResolutionUnit: none
    [339, SHORT, 1], // SampleFormat: unsigned integer
  );
  if (entries.length !== entryCount) throw new Error('invariant: TIFF entry count mismatch');

  const out = Buffer.alloc(stripOffset + stripBytes);
  out.write('II', 0, 'latin1');
  out.writeUInt16LE(42, 2);
  out.writeUInt32LE(ifdOffset, 4);
  out.writeUInt16LE(entryCount, ifdOffset);
  entries.forEach(([tag, type, value], k) => {
    const at = ifdOffset + 2 + k * 12;
    out.writeUInt16LE(tag, at);
    out.writeUInt16LE(type, at + 2);
    out.writeUInt32LE(1, at + 4);
    // SHORT values sit left-justified in the 4-byte value field.
    if (type === SHORT) out.writeUInt16LE(value, at + 8);
    else out.writeUInt32LE(value, at + 8);
  });
  out.writeUInt32LE(0, ifdOffset + 2 + entryCount * 12);
  for (const offset of [xResolutionOffset, yResolutionOffset]) {
    out.writeUInt32LE(1, offset);
    out.writeUInt32LE(1, offset + 4);
  }
  for (let k = 0; k < pixels.length; k++) out.writeUInt16LE(pixels[k], stripOffset + 2 * k);
  return out;
}
