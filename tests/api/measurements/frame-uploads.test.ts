import { createHash, randomBytes } from 'node:crypto';
import { createReadStream } from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { Readable } from 'node:stream';
import { eq } from 'drizzle-orm';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analysisRuns, frames, measurements } from '../../../server/db/schema';
import { HttpError } from '../../../server/http-error';
import { CSRF_COOKIE_NAME, CSRF_HEADER_NAME } from '../../../server/middleware/csrf';
import { SESSION_COOKIE_NAME } from '../../../server/middleware/session';
import { loadSweepContext, storeFrameFromStream, sweepObjectPrefix } from '../../../server/services/frame-storage';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { createTestBench, createTestLens, createTestWorkOrder, finiteConjugateBody, type TestBench } from './bench-records';
import { makeJpeg, readUploadFixture, UPLOAD_FIXTURES_DIR } from './upload-fixtures';

let testApp: TestApp;
let technician: SignedInSession;
let reviewer: SignedInSession;
let bench: TestBench;
let lensId: string;

beforeAll(async () => {
  testApp = createTestApp();
  technician = await signedInWithRoles(testApp, ['technician']);
  reviewer = await signedInWithRoles(testApp, ['reviewer']);
  bench = await createTestBench(testApp.deps);
  const { workOrder } = await createTestWorkOrder(testApp.deps);
  lensId = (await createTestLens(testApp.deps, workOrder.id)).id;
});

afterAll(async () => {
  await testApp?.close();
});

const sha256 = (data: Buffer) => createHash('sha256').update(data).digest('hex');

/** A new measurement with one sweep; its id, sweep id and the sweep's object prefix. */
async function newSweep() {
  const response = await technician.agent.post('/api/measurements').set(CSRF_HEADER_NAME, technician.csrfToken).send(finiteConjugateBody(lensId, bench));
  expect(response.status).toBe(201);
  const measurementId: string = response.body.measurement.id;
  const sweepId: string = response.body.measurement.sweeps[0].id;
  const prefix = sweepObjectPrefix(await loadSweepContext(testApp.deps.db, sweepId));
  return { measurementId, sweepId, prefix };
}

function upload(sweepId: string, content: Buffer, fileName: string, field = 'frame') {
  return technician.agent.post(`/api/sweeps/${sweepId}/frames`).set(CSRF_HEADER_NAME, technician.csrfToken).attach(field, content, { filename: fileName });
}

async function storedKeys(prefix: string): Promise<string[]> {
  return (await testApp.deps.storage.listObjects(prefix)).map((o) => o.key).sort();
}

async function frameRowsOf(sweepId: string) {
  return testApp.deps.db.select().from(frames).where(eq(frames.sweepId, sweepId));
}

describe('POST /api/sweeps/:sweepId/frames accepts', () => {
  const good: [string, string, 8 | 16, string][] = [
    ['dot-pair-8bit.png', 'image/png', 8, 'png'],
    ['dot-pair-16bit.png', 'image/png', 16, 'png'],
    ['dot-pair.jpg', 'image/jpeg', 8, 'jpg'],
    ['dot-pair-16bit.tif', 'image/tiff', 16, 'tif'],
  ];

  it.each(good)('%s (%s, %i-bit), stored byte for byte with its thumbnail and preview under the frame\'s key prefix', async (name, contentType, bitDepth, extension) => {
    const { sweepId, prefix } = await newSweep();
    const content = await readUploadFixture(name);
    const response = await upload(sweepId, content, name);
    expect(response.status).toBe(201);
    const frame = response.body.frame;
    expect(frame).toEqual({
      id: expect.any(String),
      fileName: name,
      positionMm: null,
      widthPx: 64,
      heightPx: 48,
      bitDepth,
      byteSize: content.length,
      contentType,
      excluded: false,
      thumbnailUrl: `/api/frames/${frame.id}/thumbnail`,
      previewUrl: `/api/frames/${frame.id}/preview`,
      originalUrl: `/api/frames/${frame.id}/original`,
      sha256: sha256(content),
    });
    expect(await storedKeys(prefix)).toEqual([
      `${prefix}${frame.id}/original.${extension}`,
      `${prefix}${frame.id}/preview.jpg`,
      `${prefix}${frame.id}/thumbnail.jpg`,
    ]);
    expect(sha256(await testApp.deps.storage.getObjectBuffer(`${prefix}${frame.id}/original.${extension}`))).toBe(sha256(content));
    const thumbnail = await sharp(await testApp.deps.storage.getObjectBuffer(`${prefix}${frame.id}/thumbnail.jpg`)).metadata();
    expect([thumbnail.format, thumbnail.width, thumbnail.height]).toEqual(['jpeg', 64, 48]);
  });

  it('shrinks a large frame to a 320 px thumbnail and a 1600 px preview', async () => {
    const { sweepId } = await newSweep();
    const large = await sharp({ create: { width: 2400, height: 1500, channels: 3, background: '#8a8a8a' } }).png().toBuffer();
    const response = await upload(sweepId, large, 'large.png');
    expect(response.status).toBe(201);
    const thumbnail = await reviewer.agent.get(response.body.frame.thumbnailUrl).buffer(true);
    const preview = await reviewer.agent.get(response.body.frame.previewUrl).buffer(true);
    expect(await sharp(thumbnail.body).metadata()).toMatchObject({ format: 'jpeg', width: 320, height: 200 });
    expect(await sharp(preview.body).metadata()).toMatchObject({ format: 'jpeg', width: 1600, height: 1000 });
  });

  it('stretches a 16-bit frame holding a 12-bit range to the full 8-bit range in its preview', async () => {
    const { sweepId } = await newSweep();
    const response = await upload(sweepId, await readUploadFixture('dot-pair-16bit.png'), 'deep.png');
    const preview = await reviewer.agent.get(response.body.frame.previewUrl).buffer(true);
    const stats = await sharp(preview.body).stats();
    // Unstretched, 515–3481 of 65535 would show as 2–14 of 255: black.
    expect(stats.channels[0].min).toBeLessThanOrEqual(8);
    expect(stats.channels[0].max).toBeGreaterThanOrEqual(247);
  });

  it('sanitises the file name: path, control and format characters are removed and the extension kept', async () => {
    const { sweepId } = await newSweep();
    const content = await readUploadFixture('dot-pair-8bit.png');
    const response = await upload(sweepId, content, 'frame:07*?\u202e.png');
    expect(response.status).toBe(201);
    expect(response.body.frame.fileName).toBe('frame07.png');
    const throughFolders = await upload(sweepId, content, '../../bench/run 3/frame08.png');
    expect(throughFolders.status).toBe(201);
    expect(throughFolders.body.frame.fileName).toBe('frame08.png');
  });

  it('takes a frame from a file stream through storeFrameFromStream, the path the seed and the analysis side use', async () => {
    const { sweepId, prefix } = await newSweep();
    const frame = await storeFrameFromStream(testApp.deps, {
      sweepId,
      fileName: 'from-disk.tif',
      stream: createReadStream(path.join(UPLOAD_FIXTURES_DIR, 'dot-pair-16bit.tif')),
    });
    expect(frame).toMatchObject({ fileName: 'from-disk.tif', bitDepth: 16, contentType: 'image/tiff' });
    expect(await storedKeys(prefix)).toHaveLength(3);
  });
});

describe('POST /api/sweeps/:sweepId/frames refuses, leaving no frame row and no object', () => {
  let sweep: Awaited<ReturnType<typeof newSweep>>;

  beforeAll(async () => {
    sweep = await newSweep();
  });

  async function expectNothingStored() {
    expect(await frameRowsOf(sweep.sweepId)).toEqual([]);
    expect(await storedKeys(sweep.prefix)).toEqual([]);
  }

  it('text behind a .png name (415)', async () => {
    const response = await upload(sweep.sweepId, await readUploadFixture('text-named-as.png'), 'text-named-as.png');
    expect(response.status).toBe(415);
    expect(response.body.error.message).toBe('frame text-named-as.png is not a PNG, JPEG or TIFF image: its first bytes match none of them.');
    await expectNothingStored();
  });

  it('a JPEG behind a .png name (415)', async () => {
    const response = await upload(sweep.sweepId, await makeJpeg(), '0003.png');
    expect(response.status).toBe(415);
    expect(response.body.error.message).toBe('frame 0003.png holds a JPEG image, not PNG as its name says; rename it or upload the right file.');
    await expectNothingStored();
  });

  it('a truncated JPEG (400, could not be decoded)', async () => {
    const response = await upload(sweep.sweepId, await readUploadFixture('truncated.jpg'), '0007.jpg');
    expect(response.status).toBe(400);
    expect(response.body.error.message).toMatch(/^frame 0007\.jpg could not be decoded: .*(premature end|truncated).*\.$/i);
    await expectNothingStored();
  });

  it('a PNG header claiming 100000 × 100000 pixels (400, over 60 MP)', async () => {
    const response = await upload(sweep.sweepId, await readUploadFixture('huge-dimensions.png'), 'huge-dimensions.png');
    expect(response.status).toBe(400);
    expect(response.body.error.message).toBe('frame huge-dimensions.png was refused: it has more than 60 megapixels, the most Paraxia accepts.');
    await expectNothingStored();
  });

  it('an empty file, a name without an image extension, and a name that is empty once cleaned', async () => {
    const empty = await upload(sweep.sweepId, Buffer.alloc(0), 'blank.png');
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toBe('frame blank.png is empty (0 bytes).');

    const text = await upload(sweep.sweepId, Buffer.from('447.0'), 'readings.csv');
    expect(text.status).toBe(415);
    expect(text.body.error.message).toBe('The file "readings.csv" is not an image Paraxia reads: its name must end in .png, .jpg, .jpeg, .tif or .tiff.');

    const nameless = await upload(sweep.sweepId, await readUploadFixture('dot-pair-8bit.png'), '..*.png');
    expect(nameless.status).toBe(400);
    expect(nameless.body.error.message).toBe('The file name "..*.png" is empty once path and control characters are removed; rename the file.');
    await expectNothingStored();
  });

  it('a request that is not multipart, has no file, or puts the file in another field', async () => {
    const json = await technician.agent.post(`/api/sweeps/${sweep.sweepId}/frames`).set(CSRF_HEADER_NAME, technician.csrfToken).send({ frame: 'x' });
    expect(json.status).toBe(415);
    expect(json.body.error.message).toBe('Send the frame as multipart/form-data, one image file in the field "frame".');

    const noFile = await technician.agent.post(`/api/sweeps/${sweep.sweepId}/frames`).set(CSRF_HEADER_NAME, technician.csrfToken).field('note', 'x');
    expect(noFile.status).toBe(400);
    expect(noFile.body.error.message).toBe('The upload holds no file in the field "frame".');

    const otherField = await upload(sweep.sweepId, await readUploadFixture('dot-pair-8bit.png'), 'a.png', 'image');
    expect(otherField.status).toBe(400);
    expect(otherField.body.error.message).toBe('The upload has a file in an unexpected field "image".');
    await expectNothingStored();
  });

  it('a request carrying a second file: the first, already stored, is taken back (row, objects and all)', async () => {
    const content = await readUploadFixture('dot-pair-8bit.png');
    for (const secondField of ['frame', 'extra']) {
      const response = await technician.agent
        .post(`/api/sweeps/${sweep.sweepId}/frames`)
        .set(CSRF_HEADER_NAME, technician.csrfToken)
        .attach('frame', content, { filename: 'first.png' })
        .attach(secondField, content, { filename: 'second.png' });
      expect(response.status, secondField).toBe(400);
      expect(response.body.error.message).toBe('Send one image per request in the field "frame"; this request carried more than one file, so none was kept.');
      await expectNothingStored();
    }
  });

  it('a second frame of the same name in the sweep (409), keeping the first untouched', async () => {
    const content = await readUploadFixture('dot-pair-8bit.png');
    const first = await upload(sweep.sweepId, content, '0001.png');
    expect(first.status).toBe(201);
    const keysAfterFirst = await storedKeys(sweep.prefix);

    const second = await upload(sweep.sweepId, content, '0001.png');
    expect(second.status).toBe(409);
    expect(second.body.error.message).toMatch(/^Sweep 1 of measurement M-\d{4}-\d{4,} already has a frame named 0001\.png; delete that frame first or rename the file\.$/);
    expect((await frameRowsOf(sweep.sweepId)).map((f) => f.id)).toEqual([first.body.frame.id]);
    expect(await storedKeys(sweep.prefix)).toEqual(keysAfterFirst);

    expect((await technician.agent.delete(`/api/frames/${first.body.frame.id}`).set(CSRF_HEADER_NAME, technician.csrfToken)).status).toBe(204);
    await expectNothingStored();
  });

  it('a stream that breaks off half way (storeFrameFromStream)', async () => {
    const content = await readUploadFixture('dot-pair-8bit.png');
    async function* breaking() {
      yield content.subarray(0, 100);
      throw new Error('The camera link dropped.');
    }
    await expect(storeFrameFromStream(testApp.deps, { sweepId: sweep.sweepId, fileName: 'broken.png', stream: Readable.from(breaking()) })).rejects.toThrow(
      'The camera link dropped.',
    );
    await expectNothingStored();
  });

  it('any upload once the measurement is submitted (409, before the file is read)', async () => {
    const other = await newSweep();
    await testApp.deps.db.update(measurements).set({ status: 'submitted' }).where(eq(measurements.id, other.measurementId));
    const response = await upload(other.sweepId, await readUploadFixture('dot-pair-8bit.png'), '0001.png');
    expect(response.status).toBe(409);
    expect(response.body.error.message).toMatch(/is submitted, so its frames can no longer change \(uploading frames is refused\)\.$/);
    expect(await storedKeys(other.prefix)).toEqual([]);
    await expect(
      storeFrameFromStream(testApp.deps, { sweepId: other.sweepId, fileName: '0001.png', stream: Readable.from([Buffer.from('x')]) }),
    ).rejects.toBeInstanceOf(HttpError);
  });

  it('an upload whose client goes away half way through the body', async () => {
    const server = http.createServer(testApp.app).listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    const { port } = server.address() as AddressInfo;
    const boundary = 'paraxia-test-boundary';
    const partHead = (fileName: string) =>
      Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="frame"; filename="${fileName}"\r\nContent-Type: image/png\r\n\r\n`);
    const partTail = Buffer.from(`\r\n--${boundary}--\r\n`);
    const rawUpload = (body: Buffer, declaredLength: number) => {
      const request = http.request({
        host: '127.0.0.1',
        port,
        method: 'POST',
        path: `/api/sweeps/${sweep.sweepId}/frames`,
        headers: {
          'content-type': `multipart/form-data; boundary=${boundary}`,
          'content-length': String(declaredLength),
          cookie: `${CSRF_COOKIE_NAME}=${encodeURIComponent(technician.csrfToken)}; ${SESSION_COOKIE_NAME}=${encodeURIComponent(technician.sessionCookie)}`,
          [CSRF_HEADER_NAME]: technician.csrfToken,
        },
      });
      request.write(body);
      return request;
    };
    try {
      // The same raw request, complete, is accepted: the abort below is refused for going away, not for its credentials.
      const complete = Buffer.concat([partHead('whole.png'), await readUploadFixture('dot-pair-8bit.png'), partTail]);
      const control = rawUpload(complete, complete.length);
      const status = await new Promise<number>((resolve, reject) => {
        control.on('response', (response) => {
          response.resume();
          resolve(response.statusCode ?? 0);
        });
        control.on('error', reject);
        control.end();
      });
      expect(status).toBe(201);
      const [whole] = await frameRowsOf(sweep.sweepId);
      await technician.agent.delete(`/api/frames/${whole.id}`).set(CSRF_HEADER_NAME, technician.csrfToken);

      // Past 5 MiB, so object storage has begun a multipart upload when the client leaves.
      const partial = Buffer.concat([partHead('dropped.png'), Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), randomBytes(6 * 1024 * 1024)]);
      const dropped = rawUpload(partial, partial.length + 1024 * 1024);
      dropped.on('error', () => {});
      await new Promise((resolve) => dropped.once('drain', resolve).once('error', resolve));
      dropped.destroy();
      // The server cleans up after the socket closes; wait for it by asking, not by timing.
      for (let attempt = 0; attempt < 50 && ((await frameRowsOf(sweep.sweepId)).length > 0 || (await storedKeys(sweep.prefix)).length > 0); attempt++) {
        await new Promise((resolve) => setTimeout(resolve, 100));
      }
      await expectNothingStored();
    } finally {
      await new Promise((resolve) => server.close(resolve));
    }
  });

  it('an unknown sweep (404)', async () => {
    const response = await upload('00000000-0000-4000-8000-000000000000', await readUploadFixture('dot-pair-8bit.png'), '0001.png');
    expect(response.status).toBe(404);
    expect(response.body.error.message).toBe('There is no sweep with id 00000000-0000-4000-8000-000000000000.');
  });
});

describe('frame images, exclusion and deletion', () => {
  it('streams thumbnail, preview and original with their content types, private long-lived caching and an ETag', async () => {
    const { sweepId } = await newSweep();
    const content = await readUploadFixture('dot-pair-16bit.tif');
    const { frame } = (await upload(sweepId, content, 'focus 12.tif')).body;

    const original = await reviewer.agent.get(frame.originalUrl).buffer(true);
    expect(original.status).toBe(200);
    expect(original.headers['content-type']).toBe('image/tiff');
    expect(original.headers['cache-control']).toBe('private, max-age=31536000, immutable');
    expect(original.headers['content-disposition']).toBe("inline; filename*=UTF-8''focus%2012.tif");
    expect(sha256(original.body)).toBe(sha256(content));

    const thumbnail = await reviewer.agent.get(frame.thumbnailUrl).buffer(true);
    expect(thumbnail.headers['content-type']).toBe('image/jpeg');
    expect((await sharp(thumbnail.body).metadata()).format).toBe('jpeg');

    const again = await reviewer.agent.get(frame.thumbnailUrl).set('If-None-Match', thumbnail.headers.etag);
    expect(again.status).toBe(304);
    expect(thumbnail.headers.etag).not.toBe(original.headers.etag);

    const unknown = await reviewer.agent.get('/api/frames/00000000-0000-4000-8000-000000000000/preview');
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.message).toBe('There is no frame with id 00000000-0000-4000-8000-000000000000.');
  });

  it('answers 410 with a sentence for an original purged by retention, while the thumbnail remains', async () => {
    const { sweepId } = await newSweep();
    const { frame } = (await upload(sweepId, await readUploadFixture('dot-pair-8bit.png'), 'old.png')).body;
    await testApp.deps.db.update(frames).set({ purgedAt: new Date() }).where(eq(frames.id, frame.id));
    const original = await reviewer.agent.get(frame.originalUrl);
    expect(original.status).toBe(410);
    expect(original.body.error.message).toMatch(/^The original of frame old\.png was removed by retention on \d{4}-\d{2}-\d{2}; its thumbnail, preview and the analysis results remain\.$/);
    expect((await reviewer.agent.get(frame.thumbnailUrl)).status).toBe(200);
  });

  it('excludes and includes a frame, and deletes one with its objects only before any analysis', async () => {
    const { measurementId, sweepId, prefix } = await newSweep();
    const content = await readUploadFixture('dot-pair-8bit.png');
    const a = (await upload(sweepId, content, 'a.png')).body.frame;
    const b = (await upload(sweepId, content, 'b.png')).body.frame;

    const excluded = await technician.agent.patch(`/api/frames/${a.id}`).set(CSRF_HEADER_NAME, technician.csrfToken).send({ excluded: true });
    expect(excluded.status).toBe(200);
    expect(excluded.body.frame).toMatchObject({ id: a.id, excluded: true });
    const bad = await technician.agent.patch(`/api/frames/${a.id}`).set(CSRF_HEADER_NAME, technician.csrfToken).send({ excluded: 'yes' });
    expect(bad.body.error.fields).toEqual({ excluded: 'Field "excluded" must be true or false.' });

    expect((await technician.agent.delete(`/api/frames/${a.id}`).set(CSRF_HEADER_NAME, technician.csrfToken)).status).toBe(204);
    expect((await storedKeys(prefix)).every((key) => key.startsWith(`${prefix}${b.id}/`))).toBe(true);
    expect(await storedKeys(prefix)).toHaveLength(3);

    await testApp.deps.db.insert(analysisRuns).values({ measurementId, version: 1, status: 'failed', manifest: { manifest: {}, files: [] } });
    const refused = await technician.agent.delete(`/api/frames/${b.id}`).set(CSRF_HEADER_NAME, technician.csrfToken);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/has been analysed, so frame b\.png is kept with the analyses that used it; exclude it from the next run instead\.$/);
    expect(await storedKeys(prefix)).toHaveLength(3);
  });

  it('deleting a sweep before any analysis removes its frames and every object under its prefix', async () => {
    const { measurementId, sweepId, prefix } = await newSweep();
    const added = await technician.agent
      .post(`/api/measurements/${measurementId}/sweeps`)
      .set(CSRF_HEADER_NAME, technician.csrfToken)
      .send({ moving: 'sensor', objectPositionMm: 0, lensPositionMm: 320 });
    expect(added.status).toBe(201);
    await upload(sweepId, await readUploadFixture('dot-pair-8bit.png'), '1.png');
    await upload(sweepId, await readUploadFixture('dot-pair.jpg'), '2.jpg');
    expect(await storedKeys(prefix)).toHaveLength(6);
    expect((await technician.agent.delete(`/api/sweeps/${sweepId}`).set(CSRF_HEADER_NAME, technician.csrfToken)).status).toBe(204);
    expect(await storedKeys(prefix)).toEqual([]);
    expect(await frameRowsOf(sweepId)).toEqual([]);
  });
});
