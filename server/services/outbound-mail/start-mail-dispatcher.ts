import type { AppDeps } from '../../deps';
import { dispatchDueMail } from './dispatch-due-mail';

export interface MailDispatcherOptions {
  /** Pause between rounds when the outbox is empty (default 5 s). */
  intervalMs?: number;
  /** Messages claimed per round. */
  batchSize?: number;
}

export interface RunningMailDispatcher {
  /** Finishes the round under way, then stops. */
  stop(): Promise<void>;
}

/**
 * Polls the outbox and sends what is due, in the worker process so that no
 * web request ever waits on SMTP. A full batch is followed at once by the
 * next round; otherwise the dispatcher sleeps for intervalMs.
 */
export function startMailDispatcher(deps: Pick<AppDeps, 'db' | 'mailer' | 'log'>, options: MailDispatcherOptions = {}): RunningMailDispatcher {
  const intervalMs = options.intervalMs ?? 5_000;
  const batchSize = options.batchSize ?? 20;
  let stopped = false;
  let timer: NodeJS.Timeout | undefined;
  let round: Promise<void> = Promise.resolve();

  const runRound = async () => {
    if (stopped) return;
    let claimedFullBatch = false;
    try {
      const outcome = await dispatchDueMail(deps, { limit: batchSize });
      claimedFullBatch = outcome.sent + outcome.retried + outcome.failed >= batchSize;
    } catch (error) {
      deps.log.warn('The mail dispatcher could not read the outbox; it will try again.', { error });
    }
    if (!stopped) timer = setTimeout(() => (round = runRound()), claimedFullBatch ? 0 : intervalMs);
  };
  round = runRound();

  return {
    async stop() {
      stopped = true;
      clearTimeout(timer);
      await round;
    },
  };
}
