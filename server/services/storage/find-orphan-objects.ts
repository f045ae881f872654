import { ORPHAN_LIST_MAX, type OrphanList, type OrphanObject } from '../../../shared/schemas/storage';
import type { Database } from '../../db/client';
import type { ObjectStorage } from '../object-storage';
import { findReferencedKeys } from './find-referenced-keys';

const MINUTE_MS = 60_000;

/** True when the object is at least `minimumAgeMinutes` old; an object of unknown age is treated as new. */
export function isOldEnough(lastModified: Date | null, minimumAgeMinutes: number, now: Date): boolean {
  if (!lastModified) return false;
  return now.getTime() - lastModified.getTime() >= minimumAgeMinutes * MINUTE_MS;
}

/**
 * Objects in storage that no database record points at. The bucket is read
 * one listing page at a time and each page's keys are checked against the
 * database in one go. Objects younger than the minimum age are counted but
 * not offered: an upload writes its objects before its row.
 */
export async function findOrphanObjects(
  deps: { db: Database; storage: ObjectStorage },
  options: { organisationId: string | null; minimumAgeMinutes: number; now?: Date },
): Promise<OrphanList> {
  const now = options.now ?? new Date();
  const orphans: OrphanObject[] = [];
  let scannedObjectCount = 0;
  let orphanCount = 0;
  let orphanBytes = 0;
  let youngSkippedCount = 0;
  for await (const page of deps.storage.listObjectPages(options.organisationId ? `orgs/${options.organisationId}/` : '')) {
    scannedObjectCount += page.length;
    const referenced = await findReferencedKeys(deps.db, page.map((object) => object.key));
    for (const object of page) {
      if (referenced.has(object.key)) continue;
      if (!isOldEnough(object.lastModified, options.minimumAgeMinutes, now)) {
        youngSkippedCount += 1;
        continue;
      }
      orphanCount += 1;
      orphanBytes += object.sizeBytes;
      if (orphans.length < ORPHAN_LIST_MAX) {
        orphans.push({ key: object.key, sizeBytes: object.sizeBytes, lastModified: object.lastModified?.toISOString() ?? null });
      }
    }
  }
  return {
    organisationId: options.organisationId,
    minimumAgeMinutes: options.minimumAgeMinutes,
    scannedObjectCount,
    orphanCount,
    orphanBytes,
    youngSkippedCount,
    orphans,
  };
}
