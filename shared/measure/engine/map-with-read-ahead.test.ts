import { describe, expect, it } from 'vitest';
import { mapWithReadAhead } from './map-with-read-ahead';

const delay = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

describe('mapWithReadAhead', () => {
  it('returns results in input order when reads finish out of order', async () => {
    const items = [30, 5, 20, 1, 10, 2];
    const results = await mapWithReadAhead(
      items,
      3,
      async (ms) => {
        await delay(ms);
        return ms * 2;
      },
      (value, item, index) => `${index}:${item}:${value}`,
    );
    expect(results).toEqual(['0:30:60', '1:5:10', '2:20:40', '3:1:2', '4:10:20', '5:2:4']);
  });

  it('keeps `readAhead` reads in flight while computing, never more, and holds at most readAhead + 1 values', async () => {
    let inFlight = 0;
    let mostInFlight = 0;
    let readsWhileComputing = 0;
    const alive = new Set<number>();
    let mostAlive = 0;
    await mapWithReadAhead(
      Array.from({ length: 12 }, (_, i) => i),
      2,
      async (i) => {
        inFlight++;
        mostInFlight = Math.max(mostInFlight, inFlight);
        await delay(2);
        inFlight--;
        alive.add(i);
        mostAlive = Math.max(mostAlive, alive.size);
        return i;
      },
      (value) => {
        readsWhileComputing = Math.max(readsWhileComputing, inFlight);
        alive.delete(value);
      },
    );
    expect(mostInFlight).toBe(2);
    expect(readsWhileComputing).toBe(2);
    expect(mostAlive).toBeLessThanOrEqual(3);
  });

  it('throws a failed read at its turn, after computing the items before it, and leaves no rejection unhandled', async () => {
    const computed: number[] = [];
    const unhandled: unknown[] = [];
    const onUnhandled = (reason: unknown) => unhandled.push(reason);
    process.on('unhandledRejection', onUnhandled);
    try {
      await expect(
        mapWithReadAhead(
          [0, 1, 2, 3, 4],
          3,
          async (i) => {
            await delay(1);
            if (i === 2 || i === 3) throw new Error(`frame ${i} unreadable`);
            return i;
          },
          (value) => computed.push(value),
        ),
      ).rejects.toThrow('frame 2 unreadable');
      await delay(20);
    } finally {
      process.off('unhandledRejection', onUnhandled);
    }
    expect(computed).toEqual([0, 1]);
    expect(unhandled).toEqual([]);
  });
});
