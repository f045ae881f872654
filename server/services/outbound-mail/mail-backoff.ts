/** Attempts before a message is given up as failed (an admin can still retry it). */
export const MAX_MAIL_ATTEMPTS = 5;

/** Waits after the 1st, 2nd, 3rd and 4th failed attempt: a relay that is briefly down, then one that is down for a while. */
export const MAIL_RETRY_DELAYS_MS = [30_000, 2 * 60_000, 10 * 60_000, 60 * 60_000] as const;

/** A message still 'sending' this long after it was claimed belongs to a dispatcher that died; another may take it. */
export const MAIL_SENDING_LEASE_MS = 5 * 60_000;

/** The wait before the next attempt after `attempts` failed ones (1-based); the last delay repeats. */
export function mailRetryDelayMs(attempts: number): number {
  const index = Math.min(Math.max(attempts, 1), MAIL_RETRY_DELAYS_MS.length) - 1;
  return MAIL_RETRY_DELAYS_MS[index];
}
