import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { StorageUsage } from '../../../shared/schemas/storage';
import type { StoredObjectInfo } from '../../../server/services/object-storage';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { createStoredOrganisation, putFiller, type StoredOrganisation } from './storage-layout';

let testApp: TestApp;
let admin: SignedInSession;
let quillon: StoredOrganisation;
let tarn: StoredOrganisation;
let strayKey: string;

/** The test's own reading of the key layout, written apart from the server's classifier on purpose. */
function kindOf(key: string): string {
  if (key.includes('/certificates/') && key.endsWith('.pdf')) return 'certificates';
  if (key.includes('/sweeps/') && /\/original\.[a-z]+$/.test(key)) return 'raw-frames';
  if (key.includes('/sweeps/') && (key.endsWith('/thumbnail.jpg') || key.endsWith('/preview.jpg'))) return 'renditions';
  return 'other';
}

/** Direct sums over ListObjects for one prefix: what the usage rows must equal. */
async function directSums(prefix: string) {
  const objects: StoredObjectInfo[] = await testApp.deps.storage.listObjects(prefix);
  const byKind: Record<string, { objectCount: number; bytes: number }> = {
    'raw-frames': { objectCount: 0, bytes: 0 },
    renditions: { objectCount: 0, bytes: 0 },
    certificates: { objectCount: 0, bytes: 0 },
    other: { objectCount: 0, bytes: 0 },
  };
  for (const object of objects) {
    byKind[kindOf(object.key)].objectCount += 1;
    byKind[kindOf(object.key)].bytes += object.sizeBytes;
  }
  return { objectCount: objects.length, bytes: objects.reduce((sum, object) => sum + object.sizeBytes, 0), byKind };
}

beforeAll(async () => {
  testApp = createTestApp();
  admin = await signedInWithRoles(testApp, ['admin']);
  [quillon, tarn] = await Promise.all([
    createStoredOrganisation(testApp.deps, [
      [
        { status: 'certified', frameCount: 3, certificateIssuedDaysAgo: [20] },
        { status: 'analysed', frameCount: 2 },
      ],
      [{ status: 'draft', frameCount: 1 }],
    ]),
    createStoredOrganisation(testApp.deps, [[{ status: 'certified', frameCount: 4, certificateIssuedDaysAgo: [40, 5] }]]),
  ]);
  // An object under a measurement that is neither a frame image nor a certificate.
  strayKey = `${quillon.workOrders[1].measurements[0].prefix}notes/bench-sketch.txt`;
  await putFiller(testApp.deps, strayKey, 777, 'text/plain');
});

afterAll(async () => {
  await testApp?.close();
});

async function usage(query: string): Promise<StorageUsage> {
  const response = await admin.agent.get(`/api/storage/usage?${query}`);
  expect(response.status, JSON.stringify(response.body)).toBe(200);
  return response.body as StorageUsage;
}

describe('storage usage', () => {
  it('per-organisation rows equal a direct sum over ListObjects of each organisation prefix, by kind', async () => {
    const body = await usage('pageSize=100');
    for (const organisation of [quillon, tarn]) {
      const row = body.organisations.find((item) => item.organisationId === organisation.organisationId);
      expect(row, `row for ${organisation.name}`).toBeDefined();
      const expected = await directSums(organisation.prefix);
      expect(row!.name).toBe(organisation.name);
      expect(row!.objectCount).toBe(expected.objectCount);
      expect(row!.bytes).toBe(expected.bytes);
      expect(row!.byKind).toEqual(expected.byKind);
    }
    // tarn: 4 frames × (original, thumbnail, preview) + 2 certificate revisions.
    expect(body.organisations.find((item) => item.organisationId === tarn.organisationId)!.objectCount).toBe(14);
  });

  it('one organisation: totals, work orders and measurements equal direct sums of their prefixes, largest first', async () => {
    const body = await usage(`organisationId=${quillon.organisationId}&pageSize=100`);
    const expectedTotal = await directSums(quillon.prefix);
    expect(body.totals.objectCount).toBe(expectedTotal.objectCount);
    expect(body.totals.bytes).toBe(expectedTotal.bytes);
    expect(body.totals.byKind).toEqual(expectedTotal.byKind);
    expect(body.totals.byKind.other).toEqual({ objectCount: 1, bytes: 777 });
    expect(body.organisations.map((row) => row.organisationId)).toEqual([quillon.organisationId]);

    expect(body.workOrders.total).toBe(2);
    for (const workOrder of quillon.workOrders) {
      const row = body.workOrders.items.find((item) => item.workOrderId === workOrder.workOrderId)!;
      const expected = await directSums(workOrder.prefix);
      expect(row.number).toBe(workOrder.number);
      expect(row.organisationName).toBe(quillon.name);
      expect({ objectCount: row.objectCount, bytes: row.bytes, byKind: row.byKind }).toEqual(expected);
    }
    const workOrderBytes = body.workOrders.items.map((row) => row.bytes);
    expect(workOrderBytes).toEqual([...workOrderBytes].sort((a, b) => b - a));

    expect(body.measurements.total).toBe(3);
    for (const measurement of quillon.workOrders.flatMap((workOrder) => workOrder.measurements)) {
      const row = body.measurements.items.find((item) => item.measurementId === measurement.measurementId)!;
      const expected = await directSums(measurement.prefix);
      expect(row.number).toBe(measurement.number);
      expect({ objectCount: row.objectCount, bytes: row.bytes, byKind: row.byKind }).toEqual(expected);
    }
    const measurementBytes = body.measurements.items.map((row) => row.bytes);
    expect(measurementBytes).toEqual([...measurementBytes].sort((a, b) => b - a));
  });

  it('pages work orders and measurements separately, keeping the order by bytes', async () => {
    const all = await usage(`organisationId=${quillon.organisationId}&pageSize=100`);
    const second = await usage(`organisationId=${quillon.organisationId}&pageSize=1&measurementPage=2&workOrderPage=2`);
    expect(second.measurements.items.map((row) => row.measurementId)).toEqual([all.measurements.items[1].measurementId]);
    expect(second.workOrders.items.map((row) => row.workOrderId)).toEqual([all.workOrders.items[1].workOrderId]);
    expect(second.measurements).toMatchObject({ page: 2, pageSize: 1, total: 3 });
  });

  it('refuses a page size over the limit with a sentence naming the field', async () => {
    const response = await admin.agent.get('/api/storage/usage?pageSize=1000');
    expect(response.status).toBe(400);
    expect(response.body.error.fields.pageSize).toBe('Field "pageSize" must be a whole number from 1 to 100.');
  });

  it('reads from the bucket, not the database: a page of more than 1000 keys is summed whole', async () => {
    // ListObjectsV2 returns at most 1000 keys a call (AWS S3 API reference), so this needs a second page.
    const organisation = await createStoredOrganisation(testApp.deps, []);
    const keys = Array.from({ length: 1005 }, (_, index) => `${organisation.prefix}bulk/${String(index).padStart(4, '0')}.bin`);
    for (let start = 0; start < keys.length; start += 50) {
      await Promise.all(keys.slice(start, start + 50).map((key, offset) => putFiller(testApp.deps, key, 10 + ((start + offset) % 7))));
    }
    const expectedBytes = keys.reduce((sum, _key, index) => sum + 10 + (index % 7), 0);
    const body = await usage(`organisationId=${organisation.organisationId}`);
    expect(body.totals).toMatchObject({ objectCount: 1005, bytes: expectedBytes });
    expect(body.totals.byKind.other).toEqual({ objectCount: 1005, bytes: expectedBytes });
    expect(body.workOrders.total).toBe(0);
  }, 120_000);
});
