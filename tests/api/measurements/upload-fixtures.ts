/**
 * The small images in fixtures/uploads/: good frames of every accepted kind
 * and bad files that must be refused. Made here, from code, so that anyone
 * can see what each one is and make them again:
 *
 *   node --import tsx tests/api/measurements/upload-fixtures.ts
 *
 * Good frames show a bench target (two dark dots on a light field).
 */
import { mkdir, readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import zlib from 'node:zlib';
import sharp from 'sharp';
import { projectRoot } from '../../../server/project-root';

export const UPLOAD_FIXTURES_DIR = path.join(projectRoot, 'fixtures', 'uploads');

export const FIXTURE_WIDTH_PX = 64;
export const FIXTURE_HEIGHT_PX = 48;

/** Two dark dots on a light field; `maxValue` sets the bit range (255, or 4095 for a 12-bit sensor in a 16-bit file). */
function dotPairPixels(maxValue: number, blurPx = 1.5): Float64Array {
  const out = new Float64Array(FIXTURE_WIDTH_PX * FIXTURE_HEIGHT_PX);
  const dots = [
    { x: 22, y: 24 },
    { x: 42, y: 24 },
  ];
  const radius = 5;
  for (let y = 0; y < FIXTURE_HEIGHT_PX; y++) {
    for (let x = 0; x < FIXTURE_WIDTH_PX; x++) {
      let darkness = 0;
      for (const dot of dots) {
        const distance = Math.hypot(x - dot.x, y - dot.y);
        darkness = Math.max(darkness, 1 / (1 + Math.exp((distance - radius) / blurPx)));
      }
      out[y * FIXTURE_WIDTH_PX + x] = Math.round(maxValue * (0.85 - 0.75 * darkness));
    }
  }
  return out;
}

export async function makePng8(blurPx = 1.5): Promise<Buffer> {
  const pixels = Uint8Array.from(dotPairPixels(255, blurPx));
  return sharp(pixels, { raw: { width: FIXTURE_WIDTH_PX, height: FIXTURE_HEIGHT_PX, channels: 1 } }).toColourspace('b-w').png().toBuffer();
}

export async function makePng16(): Promise<Buffer> {
  const pixels = Uint16Array.from(dotPairPixels(4095));
  return sharp(pixels, { raw: { width: FIXTURE_WIDTH_PX, height: FIXTURE_HEIGHT_PX, channels: 1 } }).toColourspace('grey16').png().toBuffer();
}

export async function makeJpeg(): Promise<Buffer> {
  const grey = dotPairPixels(255);
  const rgb = new Uint8Array(grey.length * 3);
  grey.forEach((value, i) => rgb.set([value, value, Math.min(255, value + 10)], i * 3));
  return sharp(rgb, { raw: { width: FIXTURE_WIDTH_PX, height: FIXTURE_HEIGHT_PX, channels: 3 } }).jpeg({ quality: 90 }).toBuffer();
}

/**
 * A 16-bit greyscale baseline TIFF, uncompressed, one strip, little-endian,
 * written by hand (TIFF 6.0 specification, sections 2 and 8): sharp writes
 * TIFF at 8 bits only.
 */
export function makeTiff16(): Buffer {
  const pixels = Uint16Array.from(dotPairPixels(4095));
  const entries: [tag: number, type: number, value: number][] = [
    [256, 4, FIXTURE_WIDTH_PX], // ImageWidth, LONG
    [257, 4, FIXTURE_HEIGHT_PX], // ImageLength
    [258, 3, 16], // BitsPerSample, SHORT
    [259, 3, 1], // Compression: none
    [262, 3, 1], // PhotometricInterpretation: BlackIsZero
    [273, 4, 0], // StripOffsets, filled in below
    [277, 3, 1], // SamplesPerPixel
    [278, 4, FIXTURE_HEIGHT_PX], // RowsPerStrip
    [279, 4, pixels.length * 2], // StripByteCounts
    [284, 3, 1], // PlanarConfiguration: chunky
  ];
  const ifdOffset = 8;
  const ifdLength = 2 + entries.length * 12 + 4;
  const dataOffset = ifdOffset + ifdLength;
  const out = Buffer.alloc(dataOffset + pixels.length * 2);
  out.write('II', 0, 'latin1');
  out.writeUInt16LE(42, 2);
  out.writeUInt32LE(ifdOffset, 4);
  out.writeUInt16LE(entries.length, ifdOffset);
  entries.forEach(([tag, type, value], i) => {
    const at = ifdOffset + 2 + i * 12;
    out.writeUInt16LE(tag, at);
    out.writeUInt16LE(type, at + 2);
    out.writeUInt32LE(1, at + 4);
    const stored = tag === 273 ? dataOffset : value;
    if (type === 3) out.writeUInt16LE(stored, at + 8);
    else out.writeUInt32LE(stored, at + 8);
  });
  out.writeUInt32LE(0, ifdOffset + 2 + entries.length * 12);
  pixels.forEach((value, i) => out.writeUInt16LE(value, dataOffset + i * 2));
  return out;
}

function pngChunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const typed = Buffer.concat([Buffer.from(type, 'latin1'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(zlib.crc32(typed) >>> 0);
  return Buffer.concat([length, typed, crc]);
}

/**
 * A valid PNG header claiming 100000 × 100000 8-bit grey pixels (10 000 MP)
 * followed by a few compressed rows: what a decompression bomb looks like
 * before it is decoded (PNG specification, IHDR and IDAT chunks).
 */
export function makeHugeDimensionsPng(): Buffer {
  const side = 100_000;
  const header = Buffer.alloc(13);
  header.writeUInt32BE(side, 0);
  header.writeUInt32BE(side, 4);
  header[8] = 8; // bit depth
  header[9] = 0; // colour type: greyscale
  const rows = zlib.deflateSync(Buffer.alloc((side + 1) * 4, 0));
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    pngChunk('IHDR', header),
    pngChunk('IDAT', rows),
    pngChunk('IEND', Buffer.alloc(0)),
  ]);
}

/** The fixture files: name → how it is made. */
export const uploadFixtureMakers: Record<string, () => Buffer | Promise<Buffer>> = {
  'dot-pair-8bit.png': () => makePng8(),
  'dot-pair-16bit.png': () => makePng16(),
  'dot-pair.jpg': () => makeJpeg(),
  'dot-pair-16bit.tif': () => makeTiff16(),
  'truncated.jpg': async () => {
    const whole = await makeJpeg();
    return whole.subarray(0, Math.floor(whole.length * 0.6));
  },
  'text-named-as.png': () => Buffer.from('rail readings, not an image\n0001.png,447.0\n0002.png,447.2\n'),
  'huge-dimensions.png': () => makeHugeDimensionsPng(),
};

export async function readUploadFixture(name: keyof typeof uploadFixtureMakers | string): Promise<Buffer> {
  return readFile(path.join(UPLOAD_FIXTURES_DIR, name));
}

export async function writeUploadFixtures(dir = UPLOAD_FIXTURES_DIR): Promise<string[]> {
  await mkdir(dir, { recursive: true });
  const written: string[] = [];
  for (const [name, make] of Object.entries(uploadFixtureMakers)) {
    await writeFile(path.join(dir, name), await make());
    written.push(name);
  }
  return written;
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const written = await writeUploadFixtures();
  console.log(`Wrote ${written.length} files to ${UPLOAD_FIXTURES_DIR}: ${written.join(', ')}`);
}
