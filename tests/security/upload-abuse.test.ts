/**
 * Hostile files and names on the frame upload route, beyond the everyday
 * refusals in tests/api/measurements/frame-uploads.test.ts: real
 * decompression bombs, huge dimensions in every accepted format, names built
 * to escape a folder or confuse a reader, and floods of files. Each refusal
 * must name the file, leave no frame row and no object under the sweep's
 * prefix in the bucket.
 */
import { once } from 'node:events';
import { eq } from 'drizzle-orm';
import zlib from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { frames } from '../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../server/middleware/csrf';
import { loadSweepContext, sweepObjectPrefix } from '../../server/services/frame-storage';
import { FRAME_FILE_NAME_MAX_LENGTH } from '../../shared/schemas/frames';
import { createTestBench, createTestLens, createTestWorkOrder, finiteConjugateBody, type TestBench } from '../api/measurements/bench-records';
import { makeJpeg, makePng8, makeTiff16 } from '../api/measurements/upload-fixtures';
import { signedInWithRoles, type SignedInSession } from '../helpers/browser-session';
import { createTestApp, type TestApp } from '../helpers/test-app';

let testApp: TestApp;
let technician: SignedInSession;
let bench: TestBench;
let lensId: string;
let goodPng: Buffer;

beforeAll(async () => {
  testApp = createTestApp();
  technician = await signedInWithRoles(testApp, ['technician']);
  bench = await createTestBench(testApp.deps);
  const { workOrder } = await createTestWorkOrder(testApp.deps);
  lensId = (await createTestLens(testApp.deps, workOrder.id)).id;
  goodPng = await makePng8();
});

afterAll(async () => {
  await testApp?.close();
});

async function newSweep() {
  const response = await technician.agent.post('/api/measurements').set(CSRF_HEADER_NAME, technician.csrfToken).send(finiteConjugateBody(lensId, bench));
  expect(response.status).toBe(201);
  const sweepId: string = response.body.measurement.sweeps[0].id;
  return { sweepId, prefix: sweepObjectPrefix(await loadSweepContext(testApp.deps.db, sweepId)) };
}

function upload(sweepId: string, content: Buffer, fileName: string) {
  return technician.agent.post(`/api/sweeps/${sweepId}/frames`).set(CSRF_HEADER_NAME, technician.csrfToken).attach('frame', content, { filename: fileName });
}

async function storedKeys(prefix: string): Promise<string[]> {
  return (await testApp.deps.storage.listObjects(prefix)).map((o) => o.key).sort();
}

async function expectNothingStored(sweep: { sweepId: string; prefix: string }) {
  expect(await testApp.deps.db.select().from(frames).where(eq(frames.sweepId, sweep.sweepId))).toEqual([]);
  expect(await storedKeys(sweep.prefix)).toEqual([]);
}

/* ------------------------------- bad pixels ------------------------------- */

function pngChunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const typed = Buffer.concat([Buffer.from(type, 'latin1'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(zlib.crc32(typed) >>> 0);
  return Buffer.concat([length, typed, crc]);
}

/**
 * A complete, valid 8-bit grey PNG of `side` × `side` black pixels (PNG
 * specification: IHDR, filter byte 0 per row, one zlib IDAT stream),
 * compressed row by row so the test never holds the raw pixels: at 8000 px
 * it is 64 MP of pixels in about 60 KiB, a ratio near deflate's ~1000:1.
 */
async function makeBlackPngBomb(side: number): Promise<Buffer> {
  const header = Buffer.alloc(13);
  header.writeUInt32BE(side, 0);
  header.writeUInt32BE(side, 4);
  header[8] = 8;
  header[9] = 0;
  const deflate = zlib.createDeflate({ level: 9 });
  const compressed: Buffer[] = [];
  deflate.on('data', (chunk: Buffer) => compressed.push(chunk));
  const row = Buffer.alloc(side + 1, 0);
  for (let y = 0; y < side; y++) if (!deflate.write(row)) await once(deflate, 'drain');
  deflate.end();
  await once(deflate, 'end');
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    pngChunk('IHDR', header),
    pngChunk('IDAT', Buffer.concat(compressed)),
    pngChunk('IEND', Buffer.alloc(0)),
  ]);
}

/** A small real JPEG whose SOF0 frame header is rewritten to claim `width` × `height` (ITU-T T.81 §B.2.2). */
async function makeJpegClaiming(width: number, height: number): Promise<Buffer> {
  const jpeg = Buffer.from(await makeJpeg());
  for (let at = 2; at < jpeg.length - 9; ) {
    if (jpeg[at] !== 0xff) throw new Error('JPEG marker expected');
    const marker = jpeg[at + 1];
    const length = jpeg.readUInt16BE(at + 2);
    if (marker >= 0xc0 && marker <= 0xc2) {
      jpeg.writeUInt16BE(height, at + 5);
      jpeg.writeUInt16BE(width, at + 7);
      return jpeg;
    }
    at += 2 + length;
  }
  throw new Error('no SOF marker in the JPEG');
}

/** The fixture TIFF with its ImageWidth and ImageLength entries rewritten (TIFF 6.0 §8, tags 256 and 257). */
function makeTiffClaiming(width: number, height: number): Buffer {
  const tiff = Buffer.from(makeTiff16());
  const entries = tiff.readUInt16LE(8);
  for (let i = 0; i < entries; i++) {
    const at = 10 + i * 12;
    const tag = tiff.readUInt16LE(at);
    if (tag === 256) tiff.writeUInt32LE(width, at + 8);
    if (tag === 257) tiff.writeUInt32LE(height, at + 8);
  }
  return tiff;
}

describe('POST /api/sweeps/:sweepId/frames refuses images too large to decode safely (400, naming the file, nothing stored)', () => {
  const REFUSED_PIXELS = /^frame (\S+) was refused: it has more than 60 megapixels, the most Paraxia accepts\.$/;

  it('a real decompression bomb: a whole, valid 8000 × 8000 black PNG (64 MP) of a few tens of KiB', async () => {
    const sweep = await newSweep();
    const bomb = await makeBlackPngBomb(8000);
    expect(bomb.length).toBeLessThan(200 * 1024);
    const response = await upload(sweep.sweepId, bomb, 'black-8000.png');
    expect(response.status).toBe(400);
    expect(response.body.error.message).toMatch(REFUSED_PIXELS);
    expect(response.body.error.message).toContain('black-8000.png');
    await expectNothingStored(sweep);
  });

  it('a PNG header claiming 30000 × 30000 pixels in front of a short stream', async () => {
    const sweep = await newSweep();
    const header = Buffer.alloc(13);
    header.writeUInt32BE(30_000, 0);
    header.writeUInt32BE(30_000, 4);
    header[8] = 8;
    const claim = Buffer.concat([
      Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
      pngChunk('IHDR', header),
      pngChunk('IDAT', zlib.deflateSync(Buffer.alloc(30_001 * 2))),
      pngChunk('IEND', Buffer.alloc(0)),
    ]);
    const response = await upload(sweep.sweepId, claim, 'claims-30000.png');
    expect(response.status).toBe(400);
    expect(response.body.error.message).toBe('frame claims-30000.png was refused: it has more than 60 megapixels, the most Paraxia accepts.');
    await expectNothingStored(sweep);
  });

  it('a JPEG whose frame header claims 65000 × 65000 pixels', async () => {
    const sweep = await newSweep();
    const response = await upload(sweep.sweepId, await makeJpegClaiming(65_000, 65_000), 'claims-65000.jpg');
    expect(response.status).toBe(400);
    expect(response.body.error.message).toMatch(/^frame claims-65000\.jpg (was refused: it has more than 60 megapixels|could not be decoded)/);
    await expectNothingStored(sweep);
  });

  it('a TIFF whose header claims 100000 × 100000 pixels', async () => {
    const sweep = await newSweep();
    const response = await upload(sweep.sweepId, makeTiffClaiming(100_000, 100_000), 'claims-100000.tif');
    expect(response.status).toBe(400);
    expect(response.body.error.message).toMatch(/^frame claims-100000\.tif (was refused: it has more than 60 megapixels|could not be decoded)/);
    await expectNothingStored(sweep);
  });
});

describe('POST /api/sweeps/:sweepId/frames refuses wrong content behind a right name (415, naming the file, nothing stored)', () => {
  const disguised: [string, Buffer][] = [
    ['an HTML page named .png', Buffer.from('<!doctype html><script>alert(1)</script>')],
    ['an SVG named .png', Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"/>')],
    ['a ZIP archive named .png', Buffer.from([0x50, 0x4b, 0x03, 0x04, ...Array(60).fill(0)])],
    ['a PDF named .png', Buffer.from('%PDF-1.7\n1 0 obj << >> endobj\n')],
    ['a GIF named .png', Buffer.from('GIF89a\x01\x00\x01\x00\x00\x00\x00;', 'latin1')],
    ['a PNG signature only', Buffer.from([0x89, 0x50, 0x4e])],
  ];

  it.each(disguised)('%s', async (_what, content) => {
    const sweep = await newSweep();
    const response = await upload(sweep.sweepId, content, 'frame-0001.png');
    expect(response.status).toBe(415);
    expect(response.body.error.message).toBe('frame frame-0001.png is not a PNG, JPEG or TIFF image: its first bytes match none of them.');
    await expectNothingStored(sweep);
  });

  it('a zero-byte file named .tif (400)', async () => {
    const sweep = await newSweep();
    const response = await upload(sweep.sweepId, Buffer.alloc(0), 'dark-frame.tif');
    expect(response.status).toBe(400);
    expect(response.body.error.message).toBe('frame dark-frame.tif is empty (0 bytes).');
    await expectNothingStored(sweep);
  });
});

describe('POST /api/sweeps/:sweepId/frames keeps hostile names out of storage paths', () => {
  const names: [string, string][] = [
    ['../../x.png', 'x.png'],
    ['..\\..\\windows\\x.png', 'x.png'],
    ['a\\b.png', 'b.png'],
    ['/etc/passwd.png', 'passwd.png'],
    ['line\r\nbreak.png', 'linebreak.png'],
    ['Brennweite ø25 – 焦点 µm.png', 'Brennweite ø25 – 焦点 µm.png'],
    ['e\u0301clair.png', 'éclair.png'],
    ["'; DROP TABLE frames; --.png", "'; DROP TABLE frames; --.png"],
    ['<img src=x onerror=alert(1)>.png', 'img src=x onerror=alert(1).png'],
  ];

  it.each(names)('%j is stored as %j, its objects under the sweep\'s prefix and named by frame id only', async (given, expected) => {
    const sweep = await newSweep();
    const response = await upload(sweep.sweepId, goodPng, given);
    expect(response.status, JSON.stringify(response.body)).toBe(201);
    expect(response.body.frame.fileName).toBe(expected);
    const keys = await storedKeys(sweep.prefix);
    expect(keys).toHaveLength(3);
    for (const key of keys) {
      expect(key.startsWith(`${sweep.prefix}${response.body.frame.id}/`)).toBe(true);
      expect(key.slice(sweep.prefix.length)).toMatch(/^[0-9a-f-]{36}\/(original\.png|thumbnail\.jpg|preview\.jpg)$/);
    }
  });

  it('refuses a name holding a NUL byte, which breaks the part header, with 400 and a sentence (nothing stored)', async () => {
    const sweep = await newSweep();
    const response = await upload(sweep.sweepId, goodPng, 'fr\u0000ame.png');
    expect(response.status).toBe(400);
    expect(response.body.error.message).toBe(
      'The upload could not be read as a multipart form (malformed part header); check the file name for control characters and send it again.',
    );
    await expectNothingStored(sweep);
  });

  it(`shortens a 5000-character name to ${FRAME_FILE_NAME_MAX_LENGTH} characters, keeping the extension`, async () => {
    const sweep = await newSweep();
    const response = await upload(sweep.sweepId, goodPng, `${'f'.repeat(5000)}.png`);
    expect(response.status).toBe(201);
    expect(response.body.frame.fileName).toHaveLength(FRAME_FILE_NAME_MAX_LENGTH);
    expect(response.body.frame.fileName.endsWith('f.png')).toBe(true);
  });

  it('refuses a name that is nothing but path characters (400, nothing stored)', async () => {
    const sweep = await newSweep();
    const response = await upload(sweep.sweepId, goodPng, '../../.png');
    expect(response.status).toBe(400);
    expect(response.body.error.message).toMatch(/^The file name "(\.\.\/\.\.\/)?\.png" is empty once path and control characters are removed/);
    await expectNothingStored(sweep);
  });
});

describe('POST /api/sweeps/:sweepId/frames refuses many files in one request', () => {
  it('twenty images in one request: 400 with a sentence, and none of them kept', async () => {
    const sweep = await newSweep();
    let call = technician.agent.post(`/api/sweeps/${sweep.sweepId}/frames`).set(CSRF_HEADER_NAME, technician.csrfToken);
    for (let i = 1; i <= 20; i++) call = call.attach('frame', goodPng, { filename: `flood-${i}.png` });
    const response = await call;
    expect(response.status).toBe(400);
    expect(response.body.error.message).toBe('Send one image per request in the field "frame"; this request carried more than one file, so none was kept.');
    await expectNothingStored(sweep);
  });

  it('a form with hundreds of text fields: 400 with a sentence, nothing kept', async () => {
    const sweep = await newSweep();
    let call = technician.agent.post(`/api/sweeps/${sweep.sweepId}/frames`).set(CSRF_HEADER_NAME, technician.csrfToken);
    for (let i = 0; i < 300; i++) call = call.field(`note${i}`, 'x');
    const response = await call.attach('frame', goodPng, { filename: 'after-fields.png' });
    expect(response.status).toBe(400);
    expect(response.body.error.message).toMatch(/^The (form has too many fields|upload has too many parts)\.$/);
    await expectNothingStored(sweep);
  });
});
