import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { createLogger } from '../services/logger';
import { createProgressRecorder, type FrameProgress } from './create-progress-recorder';

const silent = createLogger({ level: 'silent' });

beforeEach(() => {
  vi.useFakeTimers();
});

afterEach(() => {
  vi.useRealTimers();
});

describe('createProgressRecorder', () => {
  it('writes at most one progress row per half second however often frames finish, and the last counts reach the database', async () => {
    const writes: FrameProgress[] = [];
    const recorder = createProgressRecorder({
      initial: { framesDone: 0, framesTotal: 100 },
      minIntervalMs: 500,
      write: async (progress) => {
        writes.push(progress);
      },
      log: silent,
    });
    // 100 frames finishing 20 ms apart: two seconds of work.
    for (let done = 1; done <= 100; done++) {
      recorder.onProgress({ phase: 'measuring', framesDone: done, framesTotal: 100 });
      await vi.advanceTimersByTimeAsync(20);
    }
    await vi.advanceTimersByTimeAsync(1000);
    await recorder.stop();
    // 2 s of frames plus the trailing write: at most 2 writes a second.
    expect(writes.length).toBeGreaterThanOrEqual(4);
    expect(writes.length).toBeLessThanOrEqual(6);
    expect(writes.at(-1)).toEqual({ framesDone: 100, framesTotal: 100 });
    for (let k = 1; k < writes.length; k++) expect(writes[k].framesDone).toBeGreaterThan(writes[k - 1].framesDone);
  });

  it('skips a write when nothing changed and writes nothing after stop()', async () => {
    const writes: FrameProgress[] = [];
    const recorder = createProgressRecorder({
      initial: { framesDone: 0, framesTotal: 10 },
      minIntervalMs: 500,
      write: async (progress) => {
        writes.push(progress);
      },
      log: silent,
    });
    recorder.onProgress({ phase: 'locating', framesDone: 0, framesTotal: 10 });
    await vi.advanceTimersByTimeAsync(1000);
    expect(writes).toEqual([]);
    recorder.onProgress({ phase: 'measuring', framesDone: 1, framesTotal: 10 });
    await vi.advanceTimersByTimeAsync(0);
    expect(writes).toEqual([{ framesDone: 1, framesTotal: 10 }]);
    recorder.onProgress({ phase: 'measuring', framesDone: 2, framesTotal: 10 });
    await recorder.stop();
    await vi.advanceTimersByTimeAsync(1000);
    expect(writes).toHaveLength(1);
    expect(recorder.latest()).toEqual({ framesDone: 2, framesTotal: 10 });
  });

  it('keeps going when a write fails: the unsaved counts are written at the next turn, then the latest', async () => {
    const writes: FrameProgress[] = [];
    let failNext = true;
    const recorder = createProgressRecorder({
      initial: { framesDone: 0, framesTotal: 10 },
      minIntervalMs: 500,
      write: async (progress) => {
        if (failNext) {
          failNext = false;
          throw new Error('connection reset');
        }
        writes.push(progress);
      },
      log: silent,
    });
    recorder.onProgress({ phase: 'measuring', framesDone: 3, framesTotal: 10 });
    await vi.advanceTimersByTimeAsync(600);
    recorder.onProgress({ phase: 'measuring', framesDone: 4, framesTotal: 10 });
    await vi.advanceTimersByTimeAsync(600);
    await recorder.stop();
    expect(writes).toEqual([
      { framesDone: 3, framesTotal: 10 },
      { framesDone: 4, framesTotal: 10 },
    ]);
  });
});
