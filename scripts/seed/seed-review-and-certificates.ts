/**
 * Demo review history on the seeded, analysed demo measurements: some
 * submitted, one returned with a short thread, one approved, two certified
 * (one of them reissued once with a reason). It goes through the same
 * services as the API, so every step has its audit event, thread entry and
 * queued mail. Run it after the demo analyses have finished; it does nothing
 * once any demo certificate exists, so running it twice changes nothing.
 */
import { and, asc, eq, inArray } from 'drizzle-orm';
import type { AppDeps } from '../../server/deps';
import { certificates, measurements } from '../../server/db/schema';
import { addReviewComment } from '../../server/services/review/review-entries';
import { approveMeasurement } from '../../server/services/review/approve-measurement';
import { returnMeasurement } from '../../server/services/review/return-measurement';
import { submitMeasurement } from '../../server/services/review/submit-measurement';
import { issueCertificate, reissueCertificate } from '../../server/services/certificates/issue-certificate';

export const DEMO_REVIEW_EMAILS = {
  technician: 'tech@larkspur-lab.example',
  reviewer: 'review@larkspur-lab.example',
  admin: 'admin@larkspur-lab.example',
} as const;

export interface SeedReviewDeps extends Pick<AppDeps, 'db' | 'storage' | 'log'> {
  env: Pick<AppDeps['env'], 'PUBLIC_BASE_URL'>;
}

export interface SeedReviewResult {
  submitted: number;
  returned: number;
  approved: number;
  certified: number;
  reissued: number;
}

export async function seedReviewAndCertificates(
  deps: SeedReviewDeps,
  context: { personIdsByEmail: Record<string, string>; report?: (message: string) => void },
): Promise<SeedReviewResult> {
  const result: SeedReviewResult = { submitted: 0, returned: 0, approved: 0, certified: 0, reissued: 0 };
  const id = (email: string) => {
    const found = context.personIdsByEmail[email];
    if (!found) throw new Error(`The demo person ${email} must be seeded before the review history.`);
    return found;
  };
  const technician = { actorId: id(DEMO_REVIEW_EMAILS.technician), ip: null };
  const reviewer = { actorId: id(DEMO_REVIEW_EMAILS.reviewer), ip: null };
  const admin = { actorId: id(DEMO_REVIEW_EMAILS.admin), ip: null };

  const demo = await deps.db
    .select({ id: measurements.id, status: measurements.status })
    .from(measurements)
    .where(eq(measurements.performedById, technician.actorId))
    .orderBy(asc(measurements.number));
  if (demo.length === 0) return result;
  const existing = await deps.db.select({ id: certificates.id }).from(certificates).where(inArray(certificates.measurementId, demo.map((m) => m.id))).limit(1);
  if (existing.length > 0) return result;

  const ready = (
    await deps.db
      .select({ id: measurements.id })
      .from(measurements)
      .where(and(eq(measurements.performedById, technician.actorId), eq(measurements.status, 'analysed')))
      .orderBy(asc(measurements.number))
  ).map((m) => m.id);
  // Two certified, one approved, one returned, the rest (up to two) left waiting in the queue.
  const [certifiedA, certifiedB, approvedOnly, returnedOne, ...rest] = ready;
  const waiting = rest.slice(0, 2);

  for (const measurementId of [certifiedA, certifiedB, approvedOnly, returnedOne, ...waiting].filter(Boolean)) {
    await submitMeasurement(deps.db, measurementId, technician);
    result.submitted += 1;
  }
  if (returnedOne) {
    await addReviewComment(deps.db, returnedOne, reviewer, 'The focus curve of this sweep is lopsided on the far side; was the rail clamp tight?');
    await returnMeasurement(
      deps.db,
      returnedOne,
      reviewer,
      'Please repeat the far half of the sweep with the rail clamp checked, re-analyse and submit again.',
      deps.env.PUBLIC_BASE_URL,
    );
    await addReviewComment(deps.db, returnedOne, technician, 'Clamp was loose; repeating the sweep tomorrow morning.');
    result.returned += 1;
  }
  for (const measurementId of [approvedOnly, certifiedA, certifiedB].filter(Boolean)) {
    await approveMeasurement(deps.db, measurementId, reviewer, 'Budget and focus curves checked; approved.');
    result.approved += 1;
  }
  for (const measurementId of [certifiedA, certifiedB].filter(Boolean)) {
    const certificateId = await issueCertificate(deps, measurementId, admin);
    result.certified += 1;
    if (measurementId === certifiedA) {
      await reissueCertificate(deps, certificateId, 'The client’s order reference was added after issue.', reviewer);
      result.reissued += 1;
    }
  }
  context.report?.(
    `review history: ${result.submitted} submitted, ${result.returned} returned, ${result.approved} approved, ${result.certified} certified, ${result.reissued} reissued`,
  );
  return result;
}
