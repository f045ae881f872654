import { describe, expect, it } from 'vitest';
import { formatStorageBytes } from '../../../shared/schemas/storage';
import { classifyObjectKey } from '../../../server/services/storage/classify-object-key';
import { parseEnv } from '../../../server/env';
import { storageSettingsFromEnv } from '../../../server/services/storage/storage-settings';

const ORG = '11111111-2222-4333-8444-555555555555';
const WO = '21111111-2222-4333-8444-555555555555';
const M = '31111111-2222-4333-8444-555555555555';
const SWEEP = '41111111-2222-4333-8444-555555555555';
const FRAME = '51111111-2222-4333-8444-555555555555';
const MEASUREMENT_PREFIX = `orgs/${ORG}/work-orders/${WO}/measurements/${M}/`;

describe('classifyObjectKey', () => {
  it('reads a frame original, its thumbnail and preview, and a certificate from the key layout', () => {
    const place = { organisationId: ORG, workOrderId: WO, measurementId: M };
    expect(classifyObjectKey(`${MEASUREMENT_PREFIX}sweeps/${SWEEP}/${FRAME}/original.tif`)).toEqual({ ...place, kind: 'raw-frames' });
    expect(classifyObjectKey(`${MEASUREMENT_PREFIX}sweeps/${SWEEP}/${FRAME}/thumbnail.jpg`)).toEqual({ ...place, kind: 'renditions' });
    expect(classifyObjectKey(`${MEASUREMENT_PREFIX}sweeps/${SWEEP}/${FRAME}/preview.jpg`)).toEqual({ ...place, kind: 'renditions' });
    expect(classifyObjectKey(`${MEASUREMENT_PREFIX}certificates/C-2026-0007-r2.pdf`)).toEqual({ ...place, kind: 'certificates' });
  });

  it('counts anything else as "other", attributed only as far as the key names real ids', () => {
    expect(classifyObjectKey(`${MEASUREMENT_PREFIX}notes.txt`)).toMatchObject({ measurementId: M, kind: 'other' });
    expect(classifyObjectKey(`orgs/${ORG}/logo.png`)).toEqual({ organisationId: ORG, workOrderId: null, measurementId: null, kind: 'other' });
    expect(classifyObjectKey(`orgs/not-an-id/work-orders/${WO}/x`)).toEqual({ organisationId: null, workOrderId: null, measurementId: null, kind: 'other' });
    expect(classifyObjectKey('health-check.txt').organisationId).toBeNull();
  });
});

describe('formatStorageBytes', () => {
  // Decimal SI prefixes (1 kB = 1000 bytes, 1 MB = 10⁶ bytes): the SI brochure, 9th edition, Table 7.
  it('writes bytes in decimal units to three significant figures', () => {
    expect(formatStorageBytes(0)).toBe('0 bytes');
    expect(formatStorageBytes(1)).toBe('1 byte');
    expect(formatStorageBytes(999)).toBe('999 bytes');
    expect(formatStorageBytes(1000)).toBe('1.00 kB');
    expect(formatStorageBytes(1_234_567)).toBe('1.23 MB');
    expect(formatStorageBytes(999_600)).toBe('1.00 MB');
    expect(formatStorageBytes(45_600_000_000)).toBe('45.6 GB');
    expect(formatStorageBytes(-5)).toBe('—');
  });
});

describe('storageSettingsFromEnv', () => {
  it('takes defaults for unset variables and the checked values of set ones', () => {
    expect(storageSettingsFromEnv(parseEnv({}))).toEqual({ retentionDefaultDays: 365, orphanMinimumAgeMinutes: 60 });
    expect(storageSettingsFromEnv(parseEnv({ PARAXIA_RETENTION_DAYS: '90', PARAXIA_ORPHAN_MIN_AGE_MINUTES: '0' }))).toEqual({ retentionDefaultDays: 90, orphanMinimumAgeMinutes: 0 });
    expect(() => parseEnv({ PARAXIA_RETENTION_DAYS: '0' })).toThrow('PARAXIA_RETENTION_DAYS must be a whole number from 1 to 36500 (got "0").');
  });
});
