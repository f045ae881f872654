/**
 * The part of the demo that needs finished analyses: the review history and
 * the certificates. `npm start` queues the demo analyses and starts the
 * workers; this waits (in the background) until no demo analysis is queued
 * or running, then seeds the review history. It does nothing on a database
 * that already has it.
 */
import { inArray, sql } from 'drizzle-orm';
import type { AppDeps } from '../../server/deps';
import { analysisRuns, people } from '../../server/db/schema';
import { seedReviewAndCertificates, DEMO_REVIEW_EMAILS, type SeedReviewResult } from './seed-review-and-certificates';

export interface SeedAfterDemoAnalysesOptions {
  deps: Pick<AppDeps, 'db' | 'storage' | 'log'> & { env: Pick<AppDeps['env'], 'PUBLIC_BASE_URL'> };
  report: (message: string) => void;
  /** Give up waiting after this long; the demo then simply has no review history. */
  timeoutMs?: number;
  pollMs?: number;
  isStopping?: () => boolean;
}

export async function seedAfterDemoAnalyses(options: SeedAfterDemoAnalysesOptions): Promise<SeedReviewResult | null> {
  const { deps, report } = options;
  const deadline = Date.now() + (options.timeoutMs ?? 15 * 60_000);
  const pollMs = options.pollMs ?? 2_000;
  for (;;) {
    if (options.isStopping?.()) return null;
    const [pending] = await deps.db
      .select({ count: sql<number>`count(*)::int` })
      .from(analysisRuns)
      .where(inArray(analysisRuns.status, ['queued', 'running']));
    if (pending.count === 0) break;
    if (Date.now() > deadline) {
      report(`demo analyses still running after ${Math.round((options.timeoutMs ?? 15 * 60_000) / 60_000)} min; the review history was not seeded`);
      return null;
    }
    await new Promise((resolve) => setTimeout(resolve, pollMs));
  }
  const rows = await deps.db
    .select({ id: people.id, email: people.email })
    .from(people)
    .where(inArray(people.email, Object.values(DEMO_REVIEW_EMAILS)));
  const personIdsByEmail = Object.fromEntries(rows.map((row) => [row.email, row.id]));
  return seedReviewAndCertificates(deps, { personIdsByEmail, report });
}
