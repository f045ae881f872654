/**
 * Maps items through an asynchronous read and a synchronous computation,
 * keeping results in input order. Up to `readAhead` reads are in flight at
 * any time, also while a computation runs: reading (decoding, on the image
 * library's threads) and computing (on this thread) overlap, so both cores
 * stay busy. At most `readAhead` + 1 read values are held at once.
 *
 * A read that throws is rethrown when its item's turn comes; reads already
 * started are then left to settle unobserved (no unhandled rejections).
 */
export async function mapWithReadAhead<T, V, R>(
  items: readonly T[],
  readAhead: number,
  read: (item: T, index: number) => Promise<V>,
  compute: (value: V, item: T, index: number) => R,
): Promise<R[]> {
  const lanes = Math.max(1, Math.floor(readAhead));
  const settled: Promise<{ ok: true; value: V } | { ok: false; error: unknown }>[] = [];
  const start = (index: number) => {
    if (index >= items.length) return;
    settled[index] = read(items[index], index).then(
      (value) => ({ ok: true as const, value }),
      (error: unknown) => ({ ok: false as const, error }),
    );
  };
  for (let index = 0; index < Math.min(lanes, items.length); index++) start(index);
  const results = new Array<R>(items.length);
  for (let index = 0; index < items.length; index++) {
    const outcome = await settled[index];
    start(index + lanes);
    // Released as soon as it is consumed, so only the reads in flight keep their values.
    delete settled[index];
    if (!outcome.ok) throw outcome.error;
    results[index] = compute(outcome.value, items[index], index);
  }
  return results;
}
