/**
 * Maps items through an asynchronous read and a synchronous computation,
 * computing each item as soon as its read has finished (in whatever order
 * the reads finish) and returning the results in input order.
 *
 * `reads` reads are kept running whenever items are left: a read starts as
 * soon as another finishes, not when its value is consumed, so the image
 * library's threads never wait for this thread. Finished values wait for
 * this thread in a queue; no new read starts while `held` of them wait, so
 * at most `reads` + `held` read values are alive at once (plus the one being
 * computed).
 *
 * The first failure, a read that throws or a computation that throws, is
 * thrown once the reads already running have settled, and no further read
 * starts after it; values read but never computed are handed to `discard`
 * so that their buffers can be reused.
 */
export async function mapAsReadsFinish<T, V, R>(
  items: readonly T[],
  limits: { reads: number; held: number },
  read: (item: T, index: number) => Promise<V>,
  compute: (value: V, item: T, index: number) => R,
  discard: (value: V) => void = () => undefined,
): Promise<R[]> {
  const reads = Math.max(1, Math.floor(limits.reads));
  const held = Math.max(0, Math.floor(limits.held));
  const results = new Array<R>(items.length);
  const ready: { index: number; value: V }[] = [];
  let next = 0;
  let running = 0;
  let computed = 0;
  let failure: { error: unknown } | null = null;

  return new Promise<R[]>((resolve, reject) => {
    const settleIfDone = () => {
      if (failure) {
        if (running === 0) {
          for (const { value } of ready.splice(0)) discard(value);
          reject(failure.error);
        }
        return;
      }
      if (computed === items.length) resolve(results);
    };
    const startReads = () => {
      while (!failure && next < items.length && running < reads && running + ready.length < reads + held) {
        const index = next++;
        running++;
        read(items[index], index).then(
          (value) => {
            running--;
            if (failure) discard(value);
            else ready.push({ index, value });
            startReads();
            drain();
          },
          (error: unknown) => {
            running--;
            failure ??= { error };
            drain();
          },
        );
      }
    };
    // Computations run one at a time on this thread, in the order the reads finished.
    let draining = false;
    const drain = () => {
      if (draining) return;
      draining = true;
      try {
        while (!failure && ready.length > 0) {
          const { index, value } = ready.shift()!;
          // The freed place in the queue lets the next read start before this one is computed.
          startReads();
          try {
            results[index] = compute(value, items[index], index);
            computed++;
          } catch (error) {
            failure = { error };
          }
        }
      } finally {
        draining = false;
      }
      settleIfDone();
    };
    startReads();
    settleIfDone();
  });
}
