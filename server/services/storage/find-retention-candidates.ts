import { createHash } from 'node:crypto';
import { and, asc, eq, inArray, isNull, lt, min } from 'drizzle-orm';
import type { RetentionMeasurement } from '../../../shared/schemas/storage';
import type { Database } from '../../db/client';
import { certificates, frames, lenses, measurements, organisations, sweeps, workOrders } from '../../db/schema';

const DAY_MS = 24 * 60 * 60 * 1000;

export interface RetentionFrame {
  frameId: string;
  measurementId: string;
  fileName: string;
  objectKey: string;
  byteSize: number;
}

export interface RetentionCandidates {
  olderThanDays: number;
  organisationId: string | null;
  certifiedBefore: Date;
  measurements: RetentionMeasurement[];
  frames: RetentionFrame[];
  frameCount: number;
  bytes: number;
  /** sha256 over the rule and every frame in the set; equal tokens mean the same frames. */
  previewToken: string;
}

/**
 * The retention rule: the raw frames, not yet purged, of measurements that are
 * certified and whose FIRST certificate was issued more than `olderThanDays`
 * days before `now`. The first issue is the day the result became final; a
 * later reissue corrects the certificate, not the frames, so it does not
 * restart the clock. approvedAt is not used: an approved measurement without
 * a certificate is still open work.
 */
export async function findRetentionCandidates(
  db: Database,
  options: { olderThanDays: number; organisationId: string | null; now?: Date },
): Promise<RetentionCandidates> {
  const now = options.now ?? new Date();
  const certifiedBefore = new Date(now.getTime() - options.olderThanDays * DAY_MS);
  const firstIssuedAt = min(certificates.issuedAt);

  const certified = await db
    .select({
      measurementId: measurements.id,
      number: measurements.number,
      workOrderNumber: workOrders.number,
      organisationName: organisations.name,
      certifiedAt: firstIssuedAt,
    })
    .from(measurements)
    .innerJoin(certificates, eq(certificates.measurementId, measurements.id))
    .innerJoin(lenses, eq(lenses.id, measurements.lensId))
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .innerJoin(organisations, eq(organisations.id, workOrders.organisationId))
    .where(
      and(
        eq(measurements.status, 'certified'),
        options.organisationId ? eq(workOrders.organisationId, options.organisationId) : undefined,
      ),
    )
    .groupBy(measurements.id, workOrders.number, organisations.name)
    .having(lt(firstIssuedAt, certifiedBefore))
    .orderBy(asc(firstIssuedAt), asc(measurements.number));

  const frameRows =
    certified.length === 0
      ? []
      : await db
          .select({
            frameId: frames.id,
            measurementId: sweeps.measurementId,
            fileName: frames.fileName,
            objectKey: frames.objectKey,
            byteSize: frames.byteSize,
          })
          .from(frames)
          .innerJoin(sweeps, eq(sweeps.id, frames.sweepId))
          .where(and(inArray(sweeps.measurementId, certified.map((row) => row.measurementId)), isNull(frames.purgedAt)))
          .orderBy(asc(frames.id));

  const perMeasurement = new Map<string, { frameCount: number; bytes: number }>();
  const token = createHash('sha256').update(`${options.olderThanDays}|${options.organisationId ?? '*'}`);
  let bytes = 0;
  for (const frame of frameRows) {
    const sums = perMeasurement.get(frame.measurementId) ?? { frameCount: 0, bytes: 0 };
    sums.frameCount += 1;
    sums.bytes += frame.byteSize;
    perMeasurement.set(frame.measurementId, sums);
    bytes += frame.byteSize;
    token.update(`|${frame.frameId}:${frame.byteSize}`);
  }

  return {
    olderThanDays: options.olderThanDays,
    organisationId: options.organisationId,
    certifiedBefore,
    // A certified measurement whose frames are all purged already has nothing left to offer.
    measurements: certified
      .filter((row) => perMeasurement.has(row.measurementId))
      .map((row) => ({
        measurementId: row.measurementId,
        number: row.number,
        workOrderNumber: row.workOrderNumber,
        organisationName: row.organisationName,
        certifiedAt: new Date(row.certifiedAt as Date | string).toISOString(),
        frameCount: perMeasurement.get(row.measurementId)!.frameCount,
        bytes: perMeasurement.get(row.measurementId)!.bytes,
      })),
    frames: frameRows,
    frameCount: frameRows.length,
    bytes,
    previewToken: token.digest('hex'),
  };
}

