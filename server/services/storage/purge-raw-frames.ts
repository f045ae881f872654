import { and, inArray, isNull } from 'drizzle-orm';
import { formatStorageBytes, type RetentionPurgeBody, type RetentionPurgeFailure, type RetentionPurgeResult } from '../../../shared/schemas/storage';
import type { Database } from '../../db/client';
import { frames } from '../../db/schema';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { recordAuditEvent } from '../audit-log';
import type { Actor } from '../catalogue-queries';
import type { ObjectStorage } from '../object-storage';
import { findRetentionCandidates } from './find-retention-candidates';

const UPDATE_BATCH = 1000;

/**
 * Purges the raw frame objects the retention rule names, after checking that
 * the set is still the one the admin previewed (else 409, nothing deleted).
 * Only the originals go; thumbnails, previews, analysis results and
 * certificates stay. A frame is marked purged only when its object's delete
 * was confirmed, so a failed delete leaves it whole for a rerun. Objects are
 * deleted before rows are marked: a crash in between leaves unmarked frames
 * whose originals are gone, which the next run marks (S3 deletes of missing
 * keys succeed), never a marked frame whose original remains.
 */
export async function purgeRawFrames(
  deps: { db: Database; storage: ObjectStorage },
  request: RetentionPurgeBody,
  actor: Actor,
): Promise<RetentionPurgeResult> {
  const organisationId = request.organisationId ?? null;
  const candidates = await findRetentionCandidates(deps.db, { olderThanDays: request.olderThanDays, organisationId });
  if (
    candidates.previewToken !== request.previewToken ||
    candidates.frameCount !== request.expectedFrameCount ||
    candidates.bytes !== request.expectedBytes
  ) {
    throw new HttpError(
      HttpStatus.CONFLICT,
      `The frames to purge have changed since the preview: it showed ${request.expectedFrameCount} frames (${formatStorageBytes(request.expectedBytes)}), now ${candidates.frameCount} frames (${formatStorageBytes(candidates.bytes)}) match. Preview again and confirm the new set.`,
    );
  }

  const framesByKey = new Map(candidates.frames.map((frame) => [frame.objectKey, frame]));
  const outcome = candidates.frames.length === 0 ? { deleted: [], failed: [] } : await deps.storage.deleteObjects([...framesByKey.keys()]);
  const failures: RetentionPurgeFailure[] = outcome.failed.map(({ key, message }) => {
    const frame = framesByKey.get(key)!;
    return { frameId: frame.frameId, fileName: frame.fileName, key, message };
  });
  const deletedFrameIds = outcome.deleted.map((key) => framesByKey.get(key)!.frameId);

  const marked = await deps.db.transaction(async (tx) => {
    const rows: { id: string; byteSize: number }[] = [];
    for (let start = 0; start < deletedFrameIds.length; start += UPDATE_BATCH) {
      rows.push(
        ...(await tx
          .update(frames)
          .set({ purgedAt: new Date() })
          // A concurrent purge may have marked some already; each frame is counted once.
          .where(and(inArray(frames.id, deletedFrameIds.slice(start, start + UPDATE_BATCH)), isNull(frames.purgedAt)))
          .returning({ id: frames.id, byteSize: frames.byteSize })),
      );
    }
    const purgedIds = new Set(rows.map((row) => row.id));
    const measurementIds = new Set(candidates.frames.filter((frame) => purgedIds.has(frame.frameId)).map((frame) => frame.measurementId));
    const purgedBytes = rows.reduce((sum, row) => sum + row.byteSize, 0);
    if (rows.length > 0 || failures.length > 0) {
      await recordAuditEvent(tx, {
        actorId: actor.actorId,
        ip: actor.ip ?? null,
        action: 'storage.purged',
        subjectType: organisationId ? 'organisation' : 'storage',
        subjectId: organisationId ?? undefined,
        details: {
          olderThanDays: request.olderThanDays,
          certifiedBefore: candidates.certifiedBefore.toISOString(),
          organisationId,
          measurementCount: measurementIds.size,
          purgedFrameCount: rows.length,
          purgedBytes,
          failedFrameCount: failures.length,
          measurementNumbers: candidates.measurements.filter((m) => measurementIds.has(m.measurementId)).map((m) => m.number),
        },
      });
    }
    return { count: rows.length, bytes: purgedBytes, measurementCount: measurementIds.size };
  });

  return {
    olderThanDays: request.olderThanDays,
    measurementCount: marked.measurementCount,
    purgedFrameCount: marked.count,
    purgedBytes: marked.bytes,
    failures,
  };
}
