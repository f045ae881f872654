/**
 * Storage accounting, retention and orphan objects as the admin API takes and
 * returns them. Shared by the server's validators and the client; no Node APIs.
 */
import { z } from 'zod';
import { pageField, pageSizeField, uuidField } from './work-orders';

/** What an object in storage is, read from its key. */
export const storageObjectKinds = ['raw-frames', 'renditions', 'certificates', 'other'] as const;
export type StorageObjectKind = (typeof storageObjectKinds)[number];

export const STORAGE_PAGE_SIZE_DEFAULT = 20;
export const STORAGE_PAGE_SIZE_MAX = 100;
/** Retention ages an admin may ask for, in days. */
export const RETENTION_DAYS_MIN = 1;
export const RETENTION_DAYS_MAX = 36_500;
/** One removal request names at most this many keys (one S3 DeleteObjects call). */
export const ORPHAN_REMOVAL_MAX_KEYS = 1000;
/** The orphan list shows at most this many objects; the totals still count all of them. */
export const ORPHAN_LIST_MAX = 1000;

export interface StorageTally {
  objectCount: number;
  bytes: number;
}

export interface StorageBreakdown extends StorageTally {
  byKind: Record<StorageObjectKind, StorageTally>;
}

const optionalOrganisation = uuidField('organisationId').optional();

export const storageUsageQuery = z.object({
  organisationId: optionalOrganisation,
  workOrderPage: pageField(),
  measurementPage: pageField(),
  pageSize: pageSizeField(STORAGE_PAGE_SIZE_MAX, STORAGE_PAGE_SIZE_DEFAULT),
});
export type StorageUsageQuery = z.output<typeof storageUsageQuery>;

export interface OrganisationStorage extends StorageBreakdown {
  organisationId: string;
  /** null when the key names an organisation the database does not know. */
  name: string | null;
}

export interface WorkOrderStorage extends StorageBreakdown {
  workOrderId: string;
  organisationId: string;
  number: string | null;
  title: string | null;
  organisationName: string | null;
}

export interface MeasurementStorage extends StorageBreakdown {
  measurementId: string;
  workOrderId: string;
  number: string | null;
  status: string | null;
  workOrderNumber: string | null;
}

export interface StoragePage<Item> {
  items: Item[];
  page: number;
  pageSize: number;
  total: number;
}

export interface StorageUsage {
  organisationId: string | null;
  scannedAt: string;
  totals: StorageBreakdown;
  /** Objects whose key is not under orgs/{organisationId}/ (only counted when no organisation is chosen). */
  outsideOrganisations: StorageTally;
  /** Every organisation with objects, largest first. */
  organisations: OrganisationStorage[];
  workOrders: StoragePage<WorkOrderStorage>;
  measurements: StoragePage<MeasurementStorage>;
}

export interface StorageSettings {
  /** Used when a retention request gives no age. */
  retentionDefaultDays: number;
  /** Objects younger than this are never offered as orphans (an upload may be in flight). */
  orphanMinimumAgeMinutes: number;
}

function retentionDaysField() {
  const message = `Field "olderThanDays" must be a whole number of days from ${RETENTION_DAYS_MIN} to ${RETENTION_DAYS_MAX}.`;
  return z.coerce.number({ error: message }).int({ error: message }).min(RETENTION_DAYS_MIN, { error: message }).max(RETENTION_DAYS_MAX, { error: message });
}

export const retentionPreviewQuery = z.object({
  olderThanDays: retentionDaysField().optional(),
  organisationId: optionalOrganisation,
});
export type RetentionPreviewQuery = z.output<typeof retentionPreviewQuery>;

export interface RetentionMeasurement {
  measurementId: string;
  number: string;
  workOrderNumber: string;
  organisationName: string;
  /** The first certificate's issue date: when the measurement became certified. */
  certifiedAt: string;
  frameCount: number;
  bytes: number;
}

export interface RetentionPreview {
  olderThanDays: number;
  organisationId: string | null;
  /** Measurements first certified before this instant are in the set. */
  certifiedBefore: string;
  measurementCount: number;
  frameCount: number;
  bytes: number;
  /** Names exactly this set of frames; the purge refuses a different set. */
  previewToken: string;
  measurements: RetentionMeasurement[];
}

function countField(field: string) {
  const message = `Field "${field}" must be a whole number, 0 or more.`;
  return z.number({ error: message }).int({ error: message }).min(0, { error: message });
}

export const retentionPurgeBody = z.object({
  olderThanDays: retentionDaysField(),
  organisationId: uuidField('organisationId').nullable().optional(),
  expectedFrameCount: countField('expectedFrameCount'),
  expectedBytes: countField('expectedBytes'),
  previewToken: z.string({ error: 'Field "previewToken" must be the token of the preview you confirmed.' }).regex(/^[0-9a-f]{64}$/, {
    error: 'Field "previewToken" must be the token of the preview you confirmed.',
  }),
});
export type RetentionPurgeBody = z.output<typeof retentionPurgeBody>;

export interface RetentionPurgeFailure {
  frameId: string;
  fileName: string;
  key: string;
  message: string;
}

export interface RetentionPurgeResult {
  olderThanDays: number;
  measurementCount: number;
  purgedFrameCount: number;
  purgedBytes: number;
  /** Frames whose raw object could not be deleted; they stay unpurged and a rerun tries them again. */
  failures: RetentionPurgeFailure[];
}

export const orphanListQuery = z.object({ organisationId: optionalOrganisation });
export type OrphanListQuery = z.output<typeof orphanListQuery>;

export interface OrphanObject {
  key: string;
  sizeBytes: number;
  lastModified: string | null;
}

export interface OrphanList {
  organisationId: string | null;
  minimumAgeMinutes: number;
  scannedObjectCount: number;
  orphanCount: number;
  orphanBytes: number;
  /** Objects without a record that are too young to offer. */
  youngSkippedCount: number;
  /** At most ORPHAN_LIST_MAX, in key order (so grouped by organisation and work order). */
  orphans: OrphanObject[];
}

export const orphanRemovalBody = z.object({
  keys: z
    .array(
      z
        .string({ error: 'Each key must be text.' })
        .min(1, { error: 'A key must not be empty.' })
        .max(1024, { error: 'A key must be at most 1024 characters long (the S3 limit).' }),
      { error: 'Field "keys" must be a list of object keys.' },
    )
    .min(1, { error: 'Field "keys" must name at least one object.' })
    .max(ORPHAN_REMOVAL_MAX_KEYS, { error: `Field "keys" may name at most ${ORPHAN_REMOVAL_MAX_KEYS} objects at a time.` })
    .refine((keys) => new Set(keys).size === keys.length, { error: 'Field "keys" names the same object twice.' }),
});
export type OrphanRemovalBody = z.output<typeof orphanRemovalBody>;

export const orphanKeptReasons = ['has-record', 'missing', 'too-young', 'delete-failed'] as const;
export type OrphanKeptReason = (typeof orphanKeptReasons)[number];

export interface OrphanRemovalResult {
  removedCount: number;
  removedBytes: number;
  removed: { key: string; sizeBytes: number }[];
  kept: { key: string; reason: OrphanKeptReason }[];
}

const BYTE_UNITS = ['bytes', 'kB', 'MB', 'GB', 'TB', 'PB'] as const;

/**
 * A byte count in decimal SI units (1 MB = 10⁶ bytes, as storage providers
 * bill), three significant figures: "0 bytes", "999 bytes", "1.23 MB".
 */
export function formatStorageBytes(bytes: number): string {
  if (!Number.isFinite(bytes) || bytes < 0) return '—';
  if (bytes < 1000) return `${bytes} ${bytes === 1 ? 'byte' : 'bytes'}`;
  let unit = 0;
  let value = bytes;
  while (value >= 999.5 && unit < BYTE_UNITS.length - 1) {
    value /= 1000;
    unit += 1;
  }
  const digits = value >= 99.95 ? 0 : value >= 9.995 ? 1 : 2;
  return `${value.toFixed(digits)} ${BYTE_UNITS[unit]}`;
}
