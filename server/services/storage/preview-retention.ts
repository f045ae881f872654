import type { RetentionPreview } from '../../../shared/schemas/storage';
import type { Database } from '../../db/client';
import { findRetentionCandidates } from './find-retention-candidates';

/** What a purge under the retention rule would delete now: measurements, frame count, bytes and the token that names the set. */
export async function previewRetention(
  db: Database,
  options: { olderThanDays: number; organisationId: string | null },
): Promise<RetentionPreview> {
  const candidates = await findRetentionCandidates(db, options);
  return {
    olderThanDays: candidates.olderThanDays,
    organisationId: candidates.organisationId,
    certifiedBefore: candidates.certifiedBefore.toISOString(),
    measurementCount: candidates.measurements.length,
    frameCount: candidates.frameCount,
    bytes: candidates.bytes,
    previewToken: candidates.previewToken,
    measurements: candidates.measurements,
  };
}
