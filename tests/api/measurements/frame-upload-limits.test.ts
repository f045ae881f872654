import { randomBytes } from 'node:crypto';
import { Readable } from 'node:stream';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { frames } from '../../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../../server/middleware/csrf';
import { parseEnv } from '../../../server/env';
import { frameUploadSettingsFromEnv, loadSweepContext, storeFrameFromStream, sweepObjectPrefix } from '../../../server/services/frame-storage';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { createTestBench, createTestLens, createTestWorkOrder, finiteConjugateBody } from './bench-records';
import { readUploadFixture } from './upload-fixtures';

const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

/** Each app takes PARAXIA_FRAME_MAX_BYTES from its own environment when it is built. */
function appWithByteLimit(maxBytes: number): TestApp {
  return createTestApp({ env: { PARAXIA_FRAME_MAX_BYTES: String(maxBytes) } });
}

let multipartLimitApp: TestApp;
let smallLimitApp: TestApp;

beforeAll(() => {
  // Above 5 MiB the object store receives a multipart upload, which must be aborted, not left half done.
  multipartLimitApp = appWithByteLimit(6 * 1024 * 1024);
  smallLimitApp = appWithByteLimit(4096);
});

afterAll(async () => {
  await multipartLimitApp?.close();
  await smallLimitApp?.close();
});

async function newSweep(testApp: TestApp, technician: SignedInSession) {
  const bench = await createTestBench(testApp.deps);
  const { workOrder } = await createTestWorkOrder(testApp.deps);
  const lens = await createTestLens(testApp.deps, workOrder.id);
  const created = await technician.agent.post('/api/measurements').set(CSRF_HEADER_NAME, technician.csrfToken).send(finiteConjugateBody(lens.id, bench));
  const sweepId: string = created.body.measurement.sweeps[0].id;
  return { sweepId, prefix: sweepObjectPrefix(await loadSweepContext(testApp.deps.db, sweepId)) };
}

describe('frame size limit', () => {
  it.each([
    ['multipart-sized', () => multipartLimitApp, 7 * 1024 * 1024, '6 MiB'],
    ['small', () => smallLimitApp, 20_000, '4 KiB'],
  ] as const)('refuses a file over the %s limit with 413 naming it, and leaves no row and no object', async (_name, appOf, sizeBytes, limitText) => {
    const testApp = appOf();
    const technician = await signedInWithRoles(testApp, ['technician']);
    const { sweepId, prefix } = await newSweep(testApp, technician);
    const content = Buffer.concat([PNG_SIGNATURE, randomBytes(sizeBytes - PNG_SIGNATURE.length)]);
    const response = await technician.agent
      .post(`/api/sweeps/${sweepId}/frames`)
      .set(CSRF_HEADER_NAME, technician.csrfToken)
      .attach('frame', content, { filename: 'big-frame.png' });
    expect(response.status).toBe(413);
    expect(response.body.error.message).toBe(`frame big-frame.png is larger than the ${limitText} upload limit.`);
    expect(await testApp.deps.db.select().from(frames).where(eq(frames.sweepId, sweepId))).toEqual([]);
    expect(await testApp.deps.storage.listObjects(prefix)).toEqual([]);
  });

  it('accepts a file of exactly the limit and refuses one byte more (storeFrameFromStream settings)', async () => {
    const testApp = smallLimitApp;
    const technician = await signedInWithRoles(testApp, ['technician']);
    const { sweepId } = await newSweep(testApp, technician);
    const content = await readUploadFixture('dot-pair-8bit.png');
    const atLimit = await storeFrameFromStream(testApp.deps, {
      sweepId,
      fileName: 'at-limit.png',
      stream: Readable.from([content]),
      settings: { maxBytes: content.length },
    });
    expect(atLimit.byteSize).toBe(content.length);
    await expect(
      storeFrameFromStream(testApp.deps, { sweepId, fileName: 'over.png', stream: Readable.from([content]), settings: { maxBytes: content.length - 1 } }),
    ).rejects.toMatchObject({ status: 413 });
  });

  it('accepts a frame of exactly the pixel limit and refuses one with a pixel more (64 × 48 = 3072 px)', async () => {
    const testApp = smallLimitApp;
    const technician = await signedInWithRoles(testApp, ['technician']);
    const { sweepId, prefix } = await newSweep(testApp, technician);
    const content = await readUploadFixture('dot-pair-8bit.png');
    const accepted = await storeFrameFromStream(testApp.deps, { sweepId, fileName: 'a.png', stream: Readable.from([content]), settings: { maxPixels: 3072 } });
    expect([accepted.widthPx, accepted.heightPx]).toEqual([64, 48]);
    await expect(
      storeFrameFromStream(testApp.deps, { sweepId, fileName: 'b.png', stream: Readable.from([content]), settings: { maxPixels: 3071 } }),
    ).rejects.toMatchObject({ status: 400, message: 'frame b.png was refused: it has more than 0.003071 megapixels, the most Paraxia accepts.' });
    expect((await testApp.deps.storage.listObjects(prefix)).every((o) => o.key.startsWith(`${prefix}${accepted.id}/`))).toBe(true);
  });
});

describe('frameUploadSettingsFromEnv', () => {
  it('defaults to 80 MiB and 60 MP and reads the variables', () => {
    expect(frameUploadSettingsFromEnv(parseEnv({}))).toEqual({ maxBytes: 80 * 1024 * 1024, maxPixels: 60_000_000 });
    expect(frameUploadSettingsFromEnv(parseEnv({ PARAXIA_FRAME_MAX_BYTES: '1000', PARAXIA_FRAME_MAX_PIXELS: ' ' }))).toEqual({ maxBytes: 1000, maxPixels: 60_000_000 });
  });

  it('is never reached with a bad variable: parseEnv names it in a sentence', () => {
    expect(() => parseEnv({ PARAXIA_FRAME_MAX_BYTES: '80MB' })).toThrow(
      'PARAXIA_FRAME_MAX_BYTES must be a whole number from 1 to 1073741824 (got "80MB").',
    );
  });
});
