/**
 * A storage layout for the storage tests: client organisations, work orders,
 * measurements with sweeps and frames (rows and objects: original, thumbnail,
 * preview), certificates (rows and PDFs) and an analysis result, written
 * straight to the shared test database and bucket with unique names. The
 * object bodies are filler bytes of known, different sizes; nothing here
 * decodes them.
 */
import { randomBytes, randomUUID } from 'node:crypto';
import type { AppDeps } from '../../../server/deps';
import { analysisRuns, certificates, frames, measurements, sweeps, type MeasurementStatus } from '../../../server/db/schema';
import { frameObjectKeys } from '../../../server/services/frame-storage';
import { createTestOrganisation, uniqueSuffix } from '../../helpers/people';
import { insertLens, insertWorkOrder } from '../catalogue/catalogue-fixtures';

type Deps = Pick<AppDeps, 'db' | 'storage'>;

const DAY_MS = 24 * 60 * 60 * 1000;

export interface MeasurementSpec {
  status: MeasurementStatus;
  frameCount: number;
  approvedDaysAgo?: number;
  /** One certificate revision per entry, issued that many days ago (first issue first). */
  certificateIssuedDaysAgo?: number[];
}

export interface StoredFrame {
  frameId: string;
  fileName: string;
  original: string;
  thumbnail: string;
  preview: string;
  originalBytes: number;
}

export interface StoredMeasurement {
  measurementId: string;
  number: string;
  frames: StoredFrame[];
  certificateKeys: string[];
  analysisRunId: string;
  prefix: string;
}

export interface StoredWorkOrder {
  workOrderId: string;
  number: string;
  prefix: string;
  measurements: StoredMeasurement[];
}

export interface StoredOrganisation {
  organisationId: string;
  name: string;
  prefix: string;
  workOrders: StoredWorkOrder[];
}

let sizeSeed = 0;
/** Different sizes for every object, so a sum that picks the wrong objects cannot come out right by chance. */
function nextSize(base: number): number {
  sizeSeed += 1;
  return base + ((sizeSeed * 37) % 997);
}

export async function putFiller(deps: Deps, key: string, sizeBytes: number, contentType = 'application/octet-stream'): Promise<void> {
  await deps.storage.putObject(key, randomBytes(sizeBytes), { contentType });
}

export async function createStoredMeasurement(
  deps: Deps,
  place: { organisationId: string; workOrderId: string; lensId: string },
  spec: MeasurementSpec,
): Promise<StoredMeasurement> {
  const number = `M-T-${uniqueSuffix()}`;
  const [measurement] = await deps.db
    .insert(measurements)
    .values({
      number,
      lensId: place.lensId,
      method: 'finite-conjugate',
      status: spec.status,
      approvedAt: spec.approvedDaysAgo === undefined ? null : new Date(Date.now() - spec.approvedDaysAgo * DAY_MS),
    })
    .returning({ id: measurements.id });
  const [run] = await deps.db
    .insert(analysisRuns)
    .values({ measurementId: measurement.id, version: 1, status: 'succeeded', manifest: {}, result: { method: 'finite-conjugate', focalLengthMm: 100.02 } })
    .returning({ id: analysisRuns.id });
  const [sweep] = await deps.db.insert(sweeps).values({ measurementId: measurement.id, position: 0, moving: 'sensor' }).returning({ id: sweeps.id });

  const stored: StoredFrame[] = [];
  for (let index = 0; index < spec.frameCount; index += 1) {
    const frameId = randomUUID();
    const keys = frameObjectKeys({ ...place, measurementId: measurement.id, sweepId: sweep.id, frameId, format: 'png' });
    const originalBytes = nextSize(4000);
    await Promise.all([
      putFiller(deps, keys.original, originalBytes, 'image/png'),
      putFiller(deps, keys.thumbnail, nextSize(300), 'image/jpeg'),
      putFiller(deps, keys.preview, nextSize(1500), 'image/jpeg'),
    ]);
    const fileName = `f${String(index + 1).padStart(3, '0')}.png`;
    await deps.db.insert(frames).values({
      id: frameId,
      sweepId: sweep.id,
      fileName,
      positionMm: 450 + index * 0.25,
      objectKey: keys.original,
      thumbnailKey: keys.thumbnail,
      previewKey: keys.preview,
      contentType: 'image/png',
      byteSize: originalBytes,
      widthPx: 64,
      heightPx: 48,
      bitDepth: 8,
      sha256: randomBytes(32).toString('hex'),
    });
    stored.push({ frameId, fileName, original: keys.original, thumbnail: keys.thumbnail, preview: keys.preview, originalBytes });
  }

  const prefix = `orgs/${place.organisationId}/work-orders/${place.workOrderId}/measurements/${measurement.id}/`;
  const certificateKeys: string[] = [];
  const certificateNumber = `C-T-${uniqueSuffix()}`;
  for (const [index, daysAgo] of (spec.certificateIssuedDaysAgo ?? []).entries()) {
    const key = `${prefix}certificates/${certificateNumber}-r${index + 1}.pdf`;
    const byteSize = nextSize(9000);
    await putFiller(deps, key, byteSize, 'application/pdf');
    await deps.db.insert(certificates).values({
      number: certificateNumber,
      revision: index + 1,
      measurementId: measurement.id,
      organisationId: place.organisationId,
      status: index + 1 === spec.certificateIssuedDaysAgo!.length ? 'current' : 'superseded',
      verificationCode: `V${uniqueSuffix()}${uniqueSuffix()}`.toUpperCase(),
      objectKey: key,
      sha256: randomBytes(32).toString('hex'),
      byteSize,
      pageCount: 2,
      data: {},
      issuedAt: new Date(Date.now() - daysAgo * DAY_MS),
    });
    certificateKeys.push(key);
  }
  return { measurementId: measurement.id, number, frames: stored, certificateKeys, analysisRunId: run.id, prefix };
}

/** One client organisation with work orders, each with the measurements given. */
export async function createStoredOrganisation(deps: Deps, workOrderSpecs: MeasurementSpec[][]): Promise<StoredOrganisation> {
  const organisation = await createTestOrganisation(deps, { kind: 'client', name: `Storage Test Optics ${uniqueSuffix()}` });
  const workOrders: StoredWorkOrder[] = [];
  for (const specs of workOrderSpecs) {
    const workOrder = await insertWorkOrder(deps.db, { organisationId: organisation.id });
    const lens = await insertLens(deps.db, { workOrderId: workOrder.id });
    const place = { organisationId: organisation.id, workOrderId: workOrder.id, lensId: lens.id };
    const stored: StoredMeasurement[] = [];
    for (const spec of specs) stored.push(await createStoredMeasurement(deps, place, spec));
    workOrders.push({ workOrderId: workOrder.id, number: workOrder.number, prefix: `orgs/${organisation.id}/work-orders/${workOrder.id}/`, measurements: stored });
  }
  return { organisationId: organisation.id, name: organisation.name, prefix: `orgs/${organisation.id}/`, workOrders };
}
