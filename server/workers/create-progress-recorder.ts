import type { AnalysisProgress } from '../../shared/measure/engine/frame-source';
import type { Logger } from '../services/logger';

export interface FrameProgress {
  framesDone: number;
  framesTotal: number;
}

export interface ProgressRecorder {
  /** Give it every progress report; it writes at most one per interval. */
  onProgress(progress: AnalysisProgress): void;
  /** The latest progress reported (written or not). */
  latest(): FrameProgress;
  /** Stops writing and waits for a write under way. */
  stop(): Promise<void>;
}

/**
 * Throttles the engine's per-frame progress into database writes: a write
 * starts at least `minIntervalMs` after the previous one started, carries
 * the latest counts, and is skipped when nothing changed since the last.
 */
export function createProgressRecorder(options: {
  initial: FrameProgress;
  minIntervalMs: number;
  write: (progress: FrameProgress) => Promise<void>;
  log: Logger;
}): ProgressRecorder {
  let latest: FrameProgress = { ...options.initial };
  let written: FrameProgress = { ...options.initial };
  let lastWriteStartedAt = 0;
  let inFlight: Promise<void> | null = null;
  let timer: NodeJS.Timeout | null = null;
  let stopped = false;

  const changed = () => latest.framesDone !== written.framesDone || latest.framesTotal !== written.framesTotal;

  const writeNow = () => {
    timer = null;
    if (stopped || !changed()) return;
    const snapshot = { ...latest };
    lastWriteStartedAt = Date.now();
    inFlight = options
      .write(snapshot)
      .then(() => {
        written = snapshot;
      })
      .catch((error: unknown) => options.log.warn('Analysis progress could not be saved.', { error }))
      .finally(() => {
        inFlight = null;
        schedule();
      });
  };

  function schedule(): void {
    if (stopped || timer || inFlight || !changed()) return;
    const waitMs = Math.max(0, lastWriteStartedAt + options.minIntervalMs - Date.now());
    timer = setTimeout(writeNow, waitMs);
  }

  return {
    onProgress(progress) {
      latest = { framesDone: progress.framesDone, framesTotal: progress.framesTotal };
      schedule();
    },
    latest: () => ({ ...latest }),
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      timer = null;
      await inFlight;
    },
  };
}
