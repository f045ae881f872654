import { createHash, randomBytes } from 'node:crypto';
import { Readable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createObjectStorage, type ObjectStorage } from '../../server/services/object-storage';
import { uniqueSuffix } from '../helpers/people';
import { testEnv } from '../setup/test-services';

let storage: ObjectStorage;
const prefix = `tests/object-storage-${uniqueSuffix()}/`;

beforeAll(() => {
  storage = createObjectStorage(testEnv());
});

afterAll(async () => {
  if (!storage) return;
  for (const item of await storage.listObjects(prefix)) await storage.deleteObject(item.key);
  storage.close();
});

const sha256 = (data: Buffer) => createHash('sha256').update(data).digest('hex');

describe('object storage (fake S3)', () => {
  it('stores a streamed upload of unknown length byte for byte (no aws-chunked framing)', async () => {
    // 6 MiB in uneven chunks: above lib-storage's 5 MiB part size, so it goes multipart.
    const original = randomBytes(6 * 1024 * 1024 + 123);
    const chunks = [];
    for (let offset = 0; offset < original.length; offset += 700_001) chunks.push(original.subarray(offset, offset + 700_001));
    await storage.putObject(`${prefix}frame.raw`, Readable.from(chunks), { contentType: 'application/octet-stream' });

    const stored = await storage.getObjectBuffer(`${prefix}frame.raw`);
    expect(stored.length).toBe(original.length);
    expect(sha256(stored)).toBe(sha256(original));
  });

  it('stores a small streamed upload byte for byte', async () => {
    const original = Buffer.from('rail position 447.0 mm\n'.repeat(100));
    await storage.putObject(`${prefix}small.txt`, Readable.from([original]), { contentType: 'text/plain' });
    const { stream, contentType } = await storage.getObjectStream(`${prefix}small.txt`);
    const received: Buffer[] = [];
    for await (const chunk of stream) received.push(chunk as Buffer);
    expect(Buffer.concat(received).equals(original)).toBe(true);
    expect(contentType).toBe('text/plain');
  });

  it('heads, lists and deletes objects; head of a missing key is null', async () => {
    await storage.putObject(`${prefix}list/a.png`, Buffer.from([1, 2, 3]), { contentType: 'image/png' });
    await storage.putObject(`${prefix}list/b.png`, Buffer.from([4, 5]));

    const head = await storage.headObject(`${prefix}list/a.png`);
    expect(head).toMatchObject({ key: `${prefix}list/a.png`, sizeBytes: 3, contentType: 'image/png' });

    const listed = await storage.listObjects(`${prefix}list/`);
    expect(listed.map((o) => o.key).sort()).toEqual([`${prefix}list/a.png`, `${prefix}list/b.png`]);
    expect(listed.find((o) => o.key.endsWith('b.png'))?.sizeBytes).toBe(2);

    await storage.deleteObject(`${prefix}list/a.png`);
    expect(await storage.headObject(`${prefix}list/a.png`)).toBeNull();
    expect((await storage.listObjects(`${prefix}list/`)).map((o) => o.key)).toEqual([`${prefix}list/b.png`]);
  });

  it('lists more than one page (1 000 keys) of a prefix, every key once', async () => {
    // S3 answers at most 1 000 keys a page (Amazon S3 API reference, ListObjects); s3rver's v2 continuation tokens fail there.
    const keys = Array.from({ length: 1_005 }, (_, i) => `${prefix}many/${String(i).padStart(4, '0')}.txt`);
    for (let start = 0; start < keys.length; start += 25) {
      await Promise.all(keys.slice(start, start + 25).map((key) => storage.putObject(key, Buffer.from('x'))));
    }
    const pages: number[] = [];
    for await (const page of storage.listObjectPages(`${prefix}many/`)) pages.push(page.length);
    expect(pages.length).toBeGreaterThanOrEqual(2);
    const listed = (await storage.listObjects(`${prefix}many/`)).map((o) => o.key).sort();
    expect(listed).toEqual(keys);
    const removed = await storage.deleteObjects(keys);
    expect(removed.failed).toEqual([]);
    expect(await storage.listObjects(`${prefix}many/`)).toEqual([]);
  }, 120_000);

  it('ensureBucket creates a missing bucket and is harmless when it exists', async () => {
    const other = createObjectStorage({ ...testEnv(), S3_BUCKET: `ensure-${uniqueSuffix()}` });
    try {
      await expect(other.checkBucket()).rejects.toThrow();
      await other.ensureBucket();
      await other.ensureBucket();
      await expect(other.checkBucket()).resolves.toBeUndefined();
    } finally {
      other.close();
    }
  });
});
