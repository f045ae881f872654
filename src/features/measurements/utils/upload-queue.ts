/**
 * A queue that uploads many files a few at a time, one request each, and
 * keeps every file's own state (waiting, uploading with bytes sent, done,
 * failed with the server's sentence) so each can show its own progress bar
 * and a failed one can be retried alone. No DOM here: the sending is injected.
 */

export type UploadStatus = 'waiting' | 'uploading' | 'done' | 'failed';

export interface UploadEntry {
  id: string;
  fileName: string;
  byteSize: number;
  status: UploadStatus;
  sentBytes: number;
  /** The request's total as the transport reports it (can exceed byteSize by the multipart framing). */
  totalBytes: number;
  /** Why it failed, as a sentence; null unless failed. */
  message: string | null;
  attempts: number;
}

export interface UploadQueueOptions<F> {
  /** Files sent at the same time. Default 3. */
  concurrency?: number;
  describe: (file: F) => { fileName: string; byteSize: number };
  /** Sends one file; calls `report` as bytes go out; rejects with an error whose message is shown. */
  send: (file: F, report: (sentBytes: number, totalBytes: number) => void, signal: AbortSignal) => Promise<void>;
  /** The sentence shown for a failure. Default: the error's message. */
  messageFor?: (error: unknown) => string;
  /** Called after each file has been stored by the server. */
  onUploaded?: (entry: UploadEntry) => void;
}

export interface UploadQueue<F> {
  /** Queues files and starts sending up to the concurrency limit. Returns their entries. */
  add(files: readonly F[]): UploadEntry[];
  /** Sends a failed file again. */
  retry(id: string): void;
  /** Removes finished (done or failed) entries from the list. */
  clearFinished(): void;
  /** Stops everything in flight and forgets what was waiting. */
  cancelAll(): void;
  /** The current entries, in the order added; a new array after every change. */
  getSnapshot(): readonly UploadEntry[];
  subscribe(listener: () => void): () => void;
  /** Resolves when nothing is waiting or uploading. */
  whenIdle(): Promise<void>;
}

export const DEFAULT_UPLOAD_CONCURRENCY = 3;
const MAXIMUM_UPLOAD_CONCURRENCY = 6;

export function checkUploadQueueOptions<F>(options: UploadQueueOptions<F>): Required<Omit<UploadQueueOptions<F>, 'onUploaded'>> &
  Pick<UploadQueueOptions<F>, 'onUploaded'> {
  const { concurrency = DEFAULT_UPLOAD_CONCURRENCY, describe, send, messageFor, onUploaded } = options;
  if (!(Number.isInteger(concurrency) && concurrency >= 1 && concurrency <= MAXIMUM_UPLOAD_CONCURRENCY)) {
    throw new RangeError(`createUploadQueue: option "concurrency" must be an integer from 1 to ${MAXIMUM_UPLOAD_CONCURRENCY}; got ${concurrency}.`);
  }
  if (typeof describe !== 'function') throw new TypeError('createUploadQueue: option "describe" must be a function.');
  if (typeof send !== 'function') throw new TypeError('createUploadQueue: option "send" must be a function.');
  return {
    concurrency,
    describe,
    send,
    messageFor: messageFor ?? ((error) => (error instanceof Error && error.message ? error.message : 'The upload failed for an unknown reason.')),
    onUploaded,
  };
}

export function createUploadQueue<F>(options: UploadQueueOptions<F>): UploadQueue<F> {
  const { concurrency, describe, send, messageFor, onUploaded } = checkUploadQueueOptions(options);
  let entries: readonly UploadEntry[] = [];
  const files = new Map<string, F>();
  const controllers = new Map<string, AbortController>();
  const listeners = new Set<() => void>();
  let idleWaiters: (() => void)[] = [];
  let nextId = 1;

  function publish(next: readonly UploadEntry[]) {
    entries = next;
    for (const listener of listeners) listener();
    if (!entries.some((e) => e.status === 'waiting' || e.status === 'uploading')) {
      const waiters = idleWaiters;
      idleWaiters = [];
      for (const resolve of waiters) resolve();
    }
  }

  function update(id: string, change: Partial<UploadEntry>) {
    publish(entries.map((entry) => (entry.id === id ? { ...entry, ...change } : entry)));
  }

  function pump() {
    let active = entries.filter((e) => e.status === 'uploading').length;
    for (const entry of entries) {
      if (active >= concurrency) break;
      if (entry.status !== 'waiting') continue;
      active += 1;
      start(entry.id);
    }
  }

  function start(id: string) {
    const file = files.get(id);
    const entry = entries.find((e) => e.id === id);
    if (file === undefined || entry === undefined) throw new Error(`Invariant failed: upload ${id} has no file`);
    const controller = new AbortController();
    controllers.set(id, controller);
    update(id, { status: 'uploading', sentBytes: 0, message: null, attempts: entry.attempts + 1 });
    const report = (sentBytes: number, totalBytes: number) => {
      if (controller.signal.aborted) return;
      const current = entries.find((e) => e.id === id);
      if (!current || current.status !== 'uploading') return;
      const total = totalBytes > 0 ? totalBytes : current.totalBytes;
      update(id, { sentBytes: Math.min(Math.max(sentBytes, current.sentBytes), total), totalBytes: total });
    };
    // A send that throws before returning its promise still ends as a failed entry.
    new Promise<void>((resolve) => resolve(send(file, report, controller.signal))).then(
      () => {
        controllers.delete(id);
        if (controller.signal.aborted) return;
        const current = entries.find((e) => e.id === id);
        if (!current) return;
        update(id, { status: 'done', sentBytes: current.totalBytes, message: null });
        files.delete(id);
        onUploaded?.(entries.find((e) => e.id === id)!);
        pump();
      },
      (error: unknown) => {
        controllers.delete(id);
        if (controller.signal.aborted) return;
        if (!entries.some((e) => e.id === id)) return;
        update(id, { status: 'failed', message: messageFor(error) });
        pump();
      },
    );
  }

  return {
    add(newFiles) {
      const added: UploadEntry[] = newFiles.map((file) => {
        const { fileName, byteSize } = describe(file);
        const id = `upload-${nextId++}`;
        files.set(id, file);
        return { id, fileName, byteSize, status: 'waiting', sentBytes: 0, totalBytes: byteSize, message: null, attempts: 0 };
      });
      if (added.length === 0) return [];
      publish([...entries, ...added]);
      pump();
      return added.map((entry) => entries.find((e) => e.id === entry.id)!);
    },
    retry(id) {
      const entry = entries.find((e) => e.id === id);
      if (!entry || entry.status !== 'failed') return;
      update(id, { status: 'waiting', message: null, sentBytes: 0 });
      pump();
    },
    clearFinished() {
      for (const entry of entries) if (entry.status === 'done' || entry.status === 'failed') files.delete(entry.id);
      publish(entries.filter((e) => e.status !== 'done' && e.status !== 'failed'));
    },
    cancelAll() {
      for (const controller of controllers.values()) controller.abort();
      controllers.clear();
      for (const entry of entries) if (entry.status !== 'done') files.delete(entry.id);
      publish(entries.filter((e) => e.status === 'done'));
    },
    getSnapshot: () => entries,
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    whenIdle() {
      if (!entries.some((e) => e.status === 'waiting' || e.status === 'uploading')) return Promise.resolve();
      return new Promise<void>((resolve) => idleWaiters.push(resolve));
    },
  };
}

export interface UploadSummary {
  count: number;
  waiting: number;
  uploading: number;
  done: number;
  failed: number;
  sentBytes: number;
  totalBytes: number;
  /** 0..1 over all bytes, failed files excluded. */
  fraction: number;
}

export function summariseUploads(entries: readonly UploadEntry[]): UploadSummary {
  const summary: UploadSummary = { count: entries.length, waiting: 0, uploading: 0, done: 0, failed: 0, sentBytes: 0, totalBytes: 0, fraction: 0 };
  for (const entry of entries) {
    summary[entry.status] += 1;
    if (entry.status === 'failed') continue;
    summary.sentBytes += entry.status === 'done' ? entry.totalBytes : entry.sentBytes;
    summary.totalBytes += entry.totalBytes;
  }
  summary.fraction = summary.totalBytes > 0 ? summary.sentBytes / summary.totalBytes : summary.count > 0 && summary.failed < summary.count ? 1 : 0;
  return summary;
}

/**
 * Splits dropped files into those to send and those whose name the sweep (or
 * this drop) already holds: the server refuses a second file of the same name.
 */
export function splitRepeatedFileNames<F>(
  files: readonly F[],
  nameOf: (file: F) => string,
  namesAlreadyPresent: ReadonlySet<string>,
): { toSend: F[]; repeated: string[] } {
  const seen = new Set(namesAlreadyPresent);
  const toSend: F[] = [];
  const repeated: string[] = [];
  for (const file of files) {
    const name = nameOf(file);
    if (seen.has(name)) repeated.push(name);
    else {
      seen.add(name);
      toSend.push(file);
    }
  }
  return { toSend, repeated };
}
