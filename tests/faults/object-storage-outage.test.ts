/**
 * The fake S3 server stops while a technician uploads frames: the upload is
 * refused with 503 and a sentence, no frame row is written, and once the
 * store is back the same upload succeeds with nothing orphaned. This file
 * runs its own s3rver (the shared one serves every other test file).
 */
import { mkdtemp, rm } from 'node:fs/promises';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startFakeS3, type RunningFakeS3 } from '../../scripts/services/fake-s3';
import { frames } from '../../server/db/schema';
import { CSRF_COOKIE_NAME, CSRF_HEADER_NAME } from '../../server/middleware/csrf';
import { SESSION_COOKIE_NAME } from '../../server/middleware/session';
import { loadSweepContext, sweepObjectPrefix } from '../../server/services/frame-storage';
import { OBJECT_STORAGE_UNAVAILABLE_MESSAGE } from '../../server/services/object-storage';
import { createTestBench, createTestLens, createTestWorkOrder, finiteConjugateBody } from '../api/measurements/bench-records';
import { makePng8 } from '../api/measurements/upload-fixtures';
import { signedInWithRoles, type SignedInSession } from '../helpers/browser-session';
import { createTestApp, type TestApp } from '../helpers/test-app';

let s3Dir: string;
let s3: RunningFakeS3;
let s3Port: number;
let testApp: TestApp;
let technician: SignedInSession;
let lensId: string;
let bench: Awaited<ReturnType<typeof createTestBench>>;
let goodPng: Buffer;

beforeAll(async () => {
  s3Dir = await mkdtemp(path.join(process.env.PARAXIA_TEST_SCRATCH_DIR ?? tmpdir(), 's3-outage-'));
  s3 = await startFakeS3({ directory: s3Dir, port: 0 });
  s3Port = s3.port;
  testApp = createTestApp({ env: { S3_ENDPOINT: s3.endpoint, S3_BUCKET: 'paraxia-outage' } });
  await testApp.deps.storage.ensureBucket();
  technician = await signedInWithRoles(testApp, ['technician']);
  bench = await createTestBench(testApp.deps);
  const { workOrder } = await createTestWorkOrder(testApp.deps);
  lensId = (await createTestLens(testApp.deps, workOrder.id)).id;
  goodPng = await makePng8();
});

afterAll(async () => {
  await testApp?.close();
  await s3?.stop();
  if (s3Dir) await rm(s3Dir, { recursive: true, force: true });
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

const frameRows = (sweepId: string) => testApp.deps.db.select().from(frames).where(eq(frames.sweepId, sweepId));
const storedKeys = async (prefix: string) => (await testApp.deps.storage.listObjects(prefix)).map((item) => item.key).sort();

async function restartS3() {
  s3 = await startFakeS3({ directory: s3Dir, port: s3Port });
}

describe('object storage out of reach during a frame upload', () => {
  it('answers 503 with a sentence and writes no frame row; after a restart the same upload succeeds and nothing is orphaned', async () => {
    const sweep = await newSweep();
    await s3.stop();
    try {
      const refused = await upload(sweep.sweepId, goodPng, '0001.png');
      expect(refused.status).toBe(503);
      expect(refused.body).toEqual({ error: { message: OBJECT_STORAGE_UNAVAILABLE_MESSAGE } });
      expect(refused.headers['retry-after']).toBe('30');
      expect(refused.text).not.toMatch(/ECONNREFUSED|at .*\.ts/);
      expect(await frameRows(sweep.sweepId)).toEqual([]);
    } finally {
      await restartS3();
    }

    const retried = await upload(sweep.sweepId, goodPng, '0001.png');
    expect(retried.status, JSON.stringify(retried.body)).toBe(201);
    const frameId = retried.body.frame.id;
    expect((await frameRows(sweep.sweepId)).map((row) => row.id)).toEqual([frameId]);
    expect(await storedKeys(sweep.prefix)).toEqual([`${sweep.prefix}${frameId}/original.png`, `${sweep.prefix}${frameId}/preview.jpg`, `${sweep.prefix}${frameId}/thumbnail.jpg`]);
  });

  it('stopping the store while a large frame is streaming in: 503 or a dropped answer, no row, and no object under the sweep once it is back', async () => {
    const sweep = await newSweep();
    const server = http.createServer(testApp.app).listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    const { port } = server.address() as AddressInfo;
    const boundary = 'paraxia-outage-boundary';
    const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="frame"; filename="big.png"\r\nContent-Type: image/png\r\n\r\n`);
    const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
    // A PNG signature and 12 MiB after it: past 5 MiB, so object storage has begun a multipart upload when it goes away.
    const signature = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    const body = Buffer.alloc(12 * 1024 * 1024, 7);
    const totalLength = head.length + signature.length + body.length + tail.length;
    try {
      const outcome = await new Promise<{ status: number; text: string } | { dropped: string }>((resolve) => {
        const request = http.request({
          host: '127.0.0.1',
          port,
          method: 'POST',
          path: `/api/sweeps/${sweep.sweepId}/frames`,
          headers: {
            'content-type': `multipart/form-data; boundary=${boundary}`,
            'content-length': String(totalLength),
            cookie: `${CSRF_COOKIE_NAME}=${encodeURIComponent(technician.csrfToken)}; ${SESSION_COOKIE_NAME}=${encodeURIComponent(technician.sessionCookie)}`,
            [CSRF_HEADER_NAME]: technician.csrfToken,
          },
        });
        request.on('response', (response) => {
          let text = '';
          response.on('data', (chunk: Buffer) => (text += chunk.toString()));
          response.on('end', () => resolve({ status: response.statusCode ?? 0, text }));
        });
        request.on('error', (error) => resolve({ dropped: error.message }));
        request.write(head);
        request.write(signature);
        request.write(body.subarray(0, 7 * 1024 * 1024), () => {
          // Half-way through the file the store goes away; the rest of the body follows.
          void s3.stop().then(() => {
            request.write(body.subarray(7 * 1024 * 1024));
            request.end(tail);
          });
        });
      });
      if ('status' in outcome) {
        expect(outcome.status, outcome.text).toBe(503);
        expect(JSON.parse(outcome.text)).toEqual({ error: { message: OBJECT_STORAGE_UNAVAILABLE_MESSAGE } });
      }
      expect(await frameRows(sweep.sweepId)).toEqual([]);
    } finally {
      await restartS3();
      await new Promise((resolve) => server.close(resolve));
      server.closeAllConnections();
    }
    expect(await storedKeys(sweep.prefix)).toEqual([]);

    const retried = await upload(sweep.sweepId, goodPng, 'big.png');
    expect(retried.status, JSON.stringify(retried.body)).toBe(201);
    expect(await storedKeys(sweep.prefix)).toHaveLength(3);
  });

  it('answers a frame image request with 503 while the store is away, and serves it again once it is back', async () => {
    const sweep = await newSweep();
    const stored = await upload(sweep.sweepId, goodPng, 'look.png');
    expect(stored.status).toBe(201);
    const reviewer = await signedInWithRoles(testApp, ['reviewer']);
    await s3.stop();
    try {
      const away = await reviewer.agent.get(stored.body.frame.thumbnailUrl);
      expect(away.status).toBe(503);
      expect(away.body).toEqual({ error: { message: OBJECT_STORAGE_UNAVAILABLE_MESSAGE } });
    } finally {
      await restartS3();
    }
    const back = await reviewer.agent.get(stored.body.frame.thumbnailUrl);
    expect(back.status).toBe(200);
    expect(back.headers['content-type']).toBe('image/jpeg');
  });
});
