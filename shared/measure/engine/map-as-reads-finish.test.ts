import { describe, expect, it } from 'vitest';
import { mapAsReadsFinish } from './map-as-reads-finish';

const delay = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

describe('mapAsReadsFinish', () => {
  it('computes in the order reads finish and returns results in input order', async () => {
    const items = [40, 5, 25, 1, 12, 2];
    const order: number[] = [];
    const results = await mapAsReadsFinish(
      items,
      { reads: 3, held: 1 },
      async (ms) => {
        await delay(ms);
        return ms * 2;
      },
      (value, item, index) => {
        order.push(index);
        return `${index}:${item}:${value}`;
      },
    );
    expect(results).toEqual(['0:40:80', '1:5:10', '2:25:50', '3:1:2', '4:12:24', '5:2:4']);
    // Item 0's read is the slowest: later items are computed before it.
    expect(order.indexOf(0)).toBeGreaterThan(order.indexOf(1));
    expect([...order].sort()).toEqual([0, 1, 2, 3, 4, 5]);
  });

  it('keeps `reads` reads running, never more, and holds at most reads + held values', async () => {
    let running = 0;
    let mostRunning = 0;
    const alive = new Set<number>();
    let mostAlive = 0;
    let runningWhileComputing = 0;
    await mapAsReadsFinish(
      Array.from({ length: 16 }, (_, i) => i),
      { reads: 2, held: 2 },
      async (i) => {
        running++;
        mostRunning = Math.max(mostRunning, running);
        await delay(1 + (i % 3));
        running--;
        alive.add(i);
        mostAlive = Math.max(mostAlive, alive.size);
        return i;
      },
      (value) => {
        runningWhileComputing = Math.max(runningWhileComputing, running);
        const until = performance.now() + 3;
        while (performance.now() < until);
        alive.delete(value);
      },
    );
    expect(mostRunning).toBe(2);
    expect(runningWhileComputing).toBe(2);
    expect(mostAlive).toBeLessThanOrEqual(4);
  });

  it('throws the first failed read after the running reads settle, starts no more, and discards what was read', async () => {
    const started: number[] = [];
    const discarded: number[] = [];
    const unhandled: unknown[] = [];
    const onUnhandled = (reason: unknown) => unhandled.push(reason);
    process.on('unhandledRejection', onUnhandled);
    try {
      await expect(
        mapAsReadsFinish(
          [0, 1, 2, 3, 4, 5, 6, 7],
          { reads: 3, held: 0 },
          async (i) => {
            started.push(i);
            await delay(i === 1 ? 2 : 10);
            if (i === 1) throw new Error(`frame ${i} unreadable`);
            return i;
          },
          (value) => value,
          (value) => discarded.push(value),
        ),
      ).rejects.toThrow('frame 1 unreadable');
      await delay(30);
    } finally {
      process.off('unhandledRejection', onUnhandled);
    }
    expect(started).toEqual([0, 1, 2]);
    expect(discarded.sort()).toEqual([0, 2]);
    expect(unhandled).toEqual([]);
  });

  it('throws a failed computation and starts no read after it', async () => {
    const started: number[] = [];
    await expect(
      mapAsReadsFinish(
        [0, 1, 2, 3, 4, 5],
        { reads: 1, held: 0 },
        async (i) => {
          started.push(i);
          await delay(1);
          return i;
        },
        (value) => {
          if (value === 2) throw new Error('region too small');
          return value;
        },
      ),
    ).rejects.toThrow('region too small');
    expect(started).toEqual([0, 1, 2, 3]);
  });

  it('returns an empty list for no items', async () => {
    expect(await mapAsReadsFinish([], { reads: 2, held: 1 }, async () => 1, (v) => v)).toEqual([]);
  });
});
