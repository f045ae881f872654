import { describe, expect, it } from 'vitest';
import { createUploadQueue, splitRepeatedFileNames, summariseUploads, type UploadEntry } from '@/features/measurements/utils/upload-queue';

interface FakeFile {
  name: string;
  size: number;
}

/** A transport whose requests the test finishes by hand, one at a time. */
function manualTransport() {
  const inFlight = new Map<string, { report: (sent: number, total: number) => void; resolve: () => void; reject: (e: Error) => void; signal: AbortSignal }>();
  let maxConcurrent = 0;
  const send = (file: FakeFile, report: (sent: number, total: number) => void, signal: AbortSignal) =>
    new Promise<void>((resolve, reject) => {
      inFlight.set(file.name, {
        report,
        signal,
        resolve: () => {
          inFlight.delete(file.name);
          resolve();
        },
        reject: (e) => {
          inFlight.delete(file.name);
          reject(e);
        },
      });
      maxConcurrent = Math.max(maxConcurrent, inFlight.size);
    });
  return { send, inFlight, maxConcurrent: () => maxConcurrent };
}

const files = (n: number): FakeFile[] => Array.from({ length: n }, (_, i) => ({ name: `f${i + 1}.png`, size: 1000 * (i + 1) }));
const settle = () => new Promise((resolve) => setTimeout(resolve, 0));
const statuses = (entries: readonly UploadEntry[]) => entries.map((e) => `${e.fileName}:${e.status}`);

function queueWith(transport: ReturnType<typeof manualTransport>, concurrency = 3, uploaded: string[] = []) {
  return createUploadQueue<FakeFile>({
    concurrency,
    describe: (f) => ({ fileName: f.name, byteSize: f.size }),
    send: transport.send,
    onUploaded: (entry) => uploaded.push(entry.fileName),
  });
}

describe('createUploadQueue', () => {
  it('createUploadQueue never sends more files at once than its concurrency, and sends every file', async () => {
    const transport = manualTransport();
    const uploaded: string[] = [];
    const queue = queueWith(transport, 3, uploaded);
    queue.add(files(10));
    expect(transport.inFlight.size).toBe(3);
    expect(statuses(queue.getSnapshot()).slice(0, 4)).toEqual(['f1.png:uploading', 'f2.png:uploading', 'f3.png:uploading', 'f4.png:waiting']);
    while (transport.inFlight.size > 0) {
      // Finish the most recently started one, so completion order differs from start order.
      const names = [...transport.inFlight.keys()];
      transport.inFlight.get(names[names.length - 1])!.resolve();
      await settle();
      expect(transport.inFlight.size).toBeLessThanOrEqual(3);
    }
    await queue.whenIdle();
    expect(transport.maxConcurrent()).toBe(3);
    expect(queue.getSnapshot().every((e) => e.status === 'done')).toBe(true);
    expect(uploaded.sort()).toEqual(files(10).map((f) => f.name).sort());
  });

  it('createUploadQueue keeps each file its own progress, and never lets the bytes sent go backwards', async () => {
    const transport = manualTransport();
    const queue = queueWith(transport, 2);
    queue.add(files(2));
    transport.inFlight.get('f1.png')!.report(250, 1100);
    transport.inFlight.get('f2.png')!.report(1500, 2100);
    transport.inFlight.get('f1.png')!.report(200, 1100);
    const [first, second] = queue.getSnapshot();
    expect([first.sentBytes, first.totalBytes]).toEqual([250, 1100]);
    expect([second.sentBytes, second.totalBytes]).toEqual([1500, 2100]);
    const summary = summariseUploads(queue.getSnapshot());
    expect(summary).toMatchObject({ count: 2, uploading: 2, sentBytes: 1750, totalBytes: 3200 });
    expect(summary.fraction).toBeCloseTo(1750 / 3200, 12);
  });

  it('createUploadQueue records the server sentence of a failed file, goes on with the others, and retries that file alone', async () => {
    const transport = manualTransport();
    const queue = queueWith(transport, 2);
    queue.add(files(3));
    transport.inFlight.get('f1.png')!.reject(new Error('f1.png is not a PNG, JPEG or TIFF image.'));
    await settle();
    expect(statuses(queue.getSnapshot())).toEqual(['f1.png:failed', 'f2.png:uploading', 'f3.png:uploading']);
    expect(queue.getSnapshot()[0].message).toBe('f1.png is not a PNG, JPEG or TIFF image.');
    transport.inFlight.get('f2.png')!.resolve();
    transport.inFlight.get('f3.png')!.resolve();
    await queue.whenIdle();
    expect(summariseUploads(queue.getSnapshot())).toMatchObject({ done: 2, failed: 1 });

    queue.retry(queue.getSnapshot()[0].id);
    expect(transport.inFlight.has('f1.png')).toBe(true);
    expect(queue.getSnapshot()[0]).toMatchObject({ status: 'uploading', message: null, attempts: 2 });
    transport.inFlight.get('f1.png')!.resolve();
    await queue.whenIdle();
    expect(statuses(queue.getSnapshot())).toEqual(['f1.png:done', 'f2.png:done', 'f3.png:done']);
  });

  it('createUploadQueue turns a send that throws at once into a failed entry', async () => {
    const queue = createUploadQueue<FakeFile>({
      describe: (f) => ({ fileName: f.name, byteSize: f.size }),
      send: () => {
        throw new Error('Could not reach the Paraxia server.');
      },
    });
    queue.add(files(1));
    await queue.whenIdle();
    expect(queue.getSnapshot()[0]).toMatchObject({ status: 'failed', message: 'Could not reach the Paraxia server.' });
  });

  it('createUploadQueue.cancelAll aborts what is in flight and forgets what waits, keeping finished files', async () => {
    const transport = manualTransport();
    const queue = queueWith(transport, 1);
    queue.add(files(3));
    transport.inFlight.get('f1.png')!.resolve();
    await settle();
    const second = transport.inFlight.get('f2.png')!;
    queue.cancelAll();
    expect(second.signal.aborted).toBe(true);
    expect(statuses(queue.getSnapshot())).toEqual(['f1.png:done']);
    await queue.whenIdle();
  });

  it('createUploadQueue tells subscribers about every change with a new snapshot', () => {
    const transport = manualTransport();
    const queue = queueWith(transport, 1);
    const seen: (readonly UploadEntry[])[] = [];
    const unsubscribe = queue.subscribe(() => seen.push(queue.getSnapshot()));
    queue.add(files(1));
    transport.inFlight.get('f1.png')!.report(10, 1000);
    unsubscribe();
    expect(seen.length).toBeGreaterThanOrEqual(2);
    expect(new Set(seen).size).toBe(seen.length);
  });

  it('createUploadQueue names a bad concurrency in its error', () => {
    expect(() => createUploadQueue<FakeFile>({ concurrency: 0, describe: () => ({ fileName: 'a', byteSize: 1 }), send: async () => {} })).toThrow(
      'createUploadQueue: option "concurrency" must be an integer from 1 to 6; got 0.',
    );
  });
});

describe('splitRepeatedFileNames', () => {
  it('splitRepeatedFileNames holds back names the sweep already has and repeats within one drop', () => {
    const result = splitRepeatedFileNames(['a.png', 'b.png', 'a.png', 'c.png'], (n) => n, new Set(['c.png']));
    expect(result).toEqual({ toSend: ['a.png', 'b.png'], repeated: ['a.png', 'c.png'] });
  });
});
