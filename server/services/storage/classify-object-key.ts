import type { StorageObjectKind } from '../../../shared/schemas/storage';

/** Where an object sits in Paraxia's key layout (server/services/frame-storage.ts, the certificates' keys). */
export interface ObjectKeyPlace {
  organisationId: string | null;
  workOrderId: string | null;
  measurementId: string | null;
  kind: StorageObjectKind;
}

const UUID = '[0-9a-fA-F]{8}-[0-9a-fA-F]{4}-[0-9a-fA-F]{4}-[0-9a-fA-F]{4}-[0-9a-fA-F]{12}';
const ORGANISATION = new RegExp(`^orgs/(${UUID})/`);
const WORK_ORDER = new RegExp(`^orgs/${UUID}/work-orders/(${UUID})/`);
const MEASUREMENT = new RegExp(`^orgs/${UUID}/work-orders/${UUID}/measurements/(${UUID})/(.*)$`);
const FRAME_OBJECT = new RegExp(`^sweeps/${UUID}/${UUID}/(original\\.[a-z0-9]+|thumbnail\\.jpg|preview\\.jpg)$`);
const CERTIFICATE = /^certificates\/[^/]+\.pdf$/;

function kindWithinMeasurement(rest: string): StorageObjectKind {
  const frame = FRAME_OBJECT.exec(rest);
  if (frame) return frame[1].startsWith('original.') ? 'raw-frames' : 'renditions';
  if (CERTIFICATE.test(rest)) return 'certificates';
  return 'other';
}

/**
 * The organisation, work order and measurement an object key belongs to, and
 * what kind of object it is. Ids are only taken where they are UUIDs, so a
 * stray key never names a record by accident; such a key counts as "other".
 */
export function classifyObjectKey(key: string): ObjectKeyPlace {
  const organisationId = ORGANISATION.exec(key)?.[1]?.toLowerCase() ?? null;
  const workOrderId = organisationId ? (WORK_ORDER.exec(key)?.[1]?.toLowerCase() ?? null) : null;
  const measurement = workOrderId ? MEASUREMENT.exec(key) : null;
  return {
    organisationId,
    workOrderId,
    measurementId: measurement ? measurement[1].toLowerCase() : null,
    kind: measurement ? kindWithinMeasurement(measurement[2]) : 'other',
  };
}
