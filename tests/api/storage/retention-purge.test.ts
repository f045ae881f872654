import { and, desc, eq, isNull } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RetentionPreview, RetentionPurgeResult } from '../../../shared/schemas/storage';
import { analysisRuns, auditEvents, frames } from '../../../server/db/schema';
import type { ObjectStorage } from '../../../server/services/object-storage';
import { defaultStorageSettings } from '../../../server/services/storage/storage-settings';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { sendJson } from '../catalogue/catalogue-fixtures';
import { createStoredMeasurement, createStoredOrganisation, type StoredMeasurement, type StoredOrganisation } from './storage-layout';

let testApp: TestApp;
let admin: SignedInSession;
let lab: StoredOrganisation;
let otherClient: StoredOrganisation;
/** First issued 400 days ago, reissued 10 days ago: in the set for N = 365 (the first issue counts). */
let oldCertified: StoredMeasurement;
let recentCertified: StoredMeasurement;
let approvedOnly: StoredMeasurement;

beforeAll(async () => {
  testApp = createTestApp();
  admin = await signedInWithRoles(testApp, ['admin']);
  lab = await createStoredOrganisation(testApp.deps, [
    [
      { status: 'certified', frameCount: 3, approvedDaysAgo: 401, certificateIssuedDaysAgo: [400, 10] },
      { status: 'certified', frameCount: 2, approvedDaysAgo: 31, certificateIssuedDaysAgo: [30] },
    ],
    [{ status: 'approved', frameCount: 2, approvedDaysAgo: 400 }],
  ]);
  [oldCertified, recentCertified] = lab.workOrders[0].measurements;
  [approvedOnly] = lab.workOrders[1].measurements;
  otherClient = await createStoredOrganisation(testApp.deps, [[{ status: 'certified', frameCount: 2, certificateIssuedDaysAgo: [500] }]]);
});

afterAll(async () => {
  await testApp?.close();
});

async function preview(query: string): Promise<RetentionPreview> {
  const response = await admin.agent.get(`/api/storage/retention/preview?${query}`);
  expect(response.status, JSON.stringify(response.body)).toBe(200);
  return response.body as RetentionPreview;
}

function purgeBodyFrom(shown: RetentionPreview) {
  return {
    olderThanDays: shown.olderThanDays,
    organisationId: shown.organisationId,
    expectedFrameCount: shown.frameCount,
    expectedBytes: shown.bytes,
    previewToken: shown.previewToken,
  };
}

async function exists(storage: ObjectStorage, key: string): Promise<boolean> {
  return (await storage.headObject(key)) !== null;
}

describe('retention preview', () => {
  it('names only certified measurements whose first certificate is older than N days, with their raw frame count and bytes', async () => {
    const shown = await preview(`olderThanDays=365&organisationId=${lab.organisationId}`);
    expect(shown.measurements.map((row) => row.number)).toEqual([oldCertified.number]);
    expect(shown.frameCount).toBe(3);
    expect(shown.bytes).toBe(oldCertified.frames.reduce((sum, frame) => sum + frame.originalBytes, 0));
    expect(shown.measurements[0]).toMatchObject({ frameCount: 3, organisationName: lab.name });
    expect(shown.previewToken).toMatch(/^[0-9a-f]{64}$/);
  });

  it('takes its age from the setting when the request gives none', async () => {
    const shown = await preview(`organisationId=${lab.organisationId}`);
    expect(shown.olderThanDays).toBe(defaultStorageSettings.retentionDefaultDays);
  });

  it('a shorter age takes in the recently certified measurement too, never the approved-only one', async () => {
    const shown = await preview(`olderThanDays=20&organisationId=${lab.organisationId}`);
    expect(shown.measurements.map((row) => row.number).sort()).toEqual([oldCertified.number, recentCertified.number].sort());
    expect(shown.measurements.map((row) => row.number)).not.toContain(approvedOnly.number);
  });

  it('refuses an age of 0 days with a sentence naming the field', async () => {
    const response = await admin.agent.get('/api/storage/retention/preview?olderThanDays=0');
    expect(response.status).toBe(400);
    expect(response.body.error.fields.olderThanDays).toBe('Field "olderThanDays" must be a whole number of days from 1 to 36500.');
  });
});

describe('retention purge', () => {
  it('refuses with 409 and deletes nothing when the expected count does not match the set', async () => {
    const shown = await preview(`olderThanDays=365&organisationId=${lab.organisationId}`);
    const response = await sendJson(admin, 'post', '/api/storage/retention/purge', { ...purgeBodyFrom(shown), expectedFrameCount: shown.frameCount + 1 });
    expect(response.status).toBe(409);
    expect(response.body.error.message).toMatch(/^The frames to purge have changed since the preview: it showed 4 frames .*, now 3 frames .* match\. Preview again/);
    expect(await exists(testApp.deps.storage, oldCertified.frames[0].original)).toBe(true);
  });

  it('refuses with 409 when the set changed after the preview (same age, a measurement crossed into it)', async () => {
    const place = await createStoredOrganisation(testApp.deps, [[{ status: 'certified', frameCount: 1, certificateIssuedDaysAgo: [900] }]]);
    const shown = await preview(`olderThanDays=365&organisationId=${place.organisationId}`);
    const workOrder = place.workOrders[0];
    // A second old certified measurement in the same organisation appears after the preview.
    const [existing] = await testApp.deps.db.query.measurements.findMany({ where: (m, { eq: equals }) => equals(m.id, workOrder.measurements[0].measurementId) });
    await createStoredMeasurement(
      testApp.deps,
      { organisationId: place.organisationId, workOrderId: workOrder.workOrderId, lensId: existing.lensId },
      { status: 'certified', frameCount: 1, certificateIssuedDaysAgo: [800] },
    );
    const response = await sendJson(admin, 'post', '/api/storage/retention/purge', purgeBodyFrom(shown));
    expect(response.status).toBe(409);
    expect(await exists(testApp.deps.storage, workOrder.measurements[0].frames[0].original)).toBe(true);
  });

  it('deletes only the raw originals of the set, keeps thumbnails, previews, results and certificates, marks the frames and writes one audit event', async () => {
    const shown = await preview(`olderThanDays=365&organisationId=${lab.organisationId}`);
    const response = await sendJson(admin, 'post', '/api/storage/retention/purge', purgeBodyFrom(shown));
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    const result = response.body as RetentionPurgeResult;
    expect(result).toMatchObject({ purgedFrameCount: 3, purgedBytes: shown.bytes, measurementCount: 1, failures: [] });

    const { storage, db } = testApp.deps;
    for (const frame of oldCertified.frames) {
      expect(await exists(storage, frame.original), frame.original).toBe(false);
      expect(await exists(storage, frame.thumbnail)).toBe(true);
      expect(await exists(storage, frame.preview)).toBe(true);
    }
    for (const key of oldCertified.certificateKeys) expect(await exists(storage, key)).toBe(true);
    const [run] = await db.select().from(analysisRuns).where(eq(analysisRuns.id, oldCertified.analysisRunId));
    expect(run.result).toMatchObject({ focalLengthMm: 100.02 });
    const purgedRows = await db.select().from(frames).where(eq(frames.sweepId, (await db.select().from(frames).where(eq(frames.id, oldCertified.frames[0].frameId)))[0].sweepId));
    expect(purgedRows.every((row) => row.purgedAt !== null)).toBe(true);

    // Untouched: the recently certified, the approved-only and the other client's measurements.
    for (const measurement of [recentCertified, approvedOnly, otherClient.workOrders[0].measurements[0]]) {
      for (const frame of measurement.frames) {
        expect(await exists(storage, frame.original), frame.original).toBe(true);
        const [row] = await db.select().from(frames).where(eq(frames.id, frame.frameId));
        expect(row.purgedAt).toBeNull();
      }
    }

    const [event] = await db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.action, 'storage.purged'), eq(auditEvents.subjectId, lab.organisationId)))
      .orderBy(desc(auditEvents.id));
    expect(event.actorId).toBe(admin.person.id);
    expect(event.details).toMatchObject({ olderThanDays: 365, purgedFrameCount: 3, purgedBytes: shown.bytes, measurementCount: 1, measurementNumbers: [oldCertified.number] });
  });

  it('a rerun finds nothing, purges nothing and writes no second audit event', async () => {
    const shown = await preview(`olderThanDays=365&organisationId=${lab.organisationId}`);
    expect(shown).toMatchObject({ frameCount: 0, bytes: 0, measurementCount: 0 });
    const before = await testApp.deps.db.select().from(auditEvents).where(and(eq(auditEvents.action, 'storage.purged'), eq(auditEvents.subjectId, lab.organisationId)));
    const response = await sendJson(admin, 'post', '/api/storage/retention/purge', purgeBodyFrom(shown));
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ purgedFrameCount: 0, purgedBytes: 0 });
    const after = await testApp.deps.db.select().from(auditEvents).where(and(eq(auditEvents.action, 'storage.purged'), eq(auditEvents.subjectId, lab.organisationId)));
    expect(after.length).toBe(before.length);
  });

  it('the frame viewer still serves a purged frame\'s thumbnail and preview; its original answers 410 with a sentence', async () => {
    const frame = oldCertified.frames[0];
    const technician = await signedInWithRoles(testApp, ['technician']);
    expect((await technician.agent.get(`/api/frames/${frame.frameId}/thumbnail`)).status).toBe(200);
    expect((await technician.agent.get(`/api/frames/${frame.frameId}/preview`)).status).toBe(200);
    const original = await technician.agent.get(`/api/frames/${frame.frameId}/original`);
    expect(original.status).toBe(410);
    expect(original.body.error.message).toMatch(new RegExp(`^The original of frame ${frame.fileName} was removed by retention on \\d{4}-\\d{2}-\\d{2}; its thumbnail, preview and the analysis results remain\\.$`));
  });

  it('a frame whose object delete fails is not marked purged, and a rerun purges it', async () => {
    const place = await createStoredOrganisation(testApp.deps, [[{ status: 'certified', frameCount: 2, certificateIssuedDaysAgo: [700] }]]);
    const [stuck, gone] = place.workOrders[0].measurements[0].frames;
    const realStorage = testApp.deps.storage;
    const failing = createTestApp({
      deps: {
        storage: {
          ...realStorage,
          async deleteObjects(keys) {
            const outcome = await realStorage.deleteObjects(keys.filter((key) => key !== stuck.original));
            return { deleted: outcome.deleted, failed: [...outcome.failed, { key: stuck.original, message: 'Access Denied' }] };
          },
          close() {},
        },
      },
    });
    try {
      const failingAdmin = await signedInWithRoles(failing, ['admin']);
      const shown = (await failingAdmin.agent.get(`/api/storage/retention/preview?olderThanDays=365&organisationId=${place.organisationId}`)).body as RetentionPreview;
      const response = await sendJson(failingAdmin, 'post', '/api/storage/retention/purge', purgeBodyFrom(shown));
      expect(response.status).toBe(200);
      expect(response.body.purgedFrameCount).toBe(1);
      expect(response.body.failures).toEqual([{ frameId: stuck.frameId, fileName: stuck.fileName, key: stuck.original, message: 'Access Denied' }]);
    } finally {
      await failing.close();
    }
    const db = testApp.deps.db;
    expect((await db.select().from(frames).where(and(eq(frames.id, stuck.frameId), isNull(frames.purgedAt)))).length).toBe(1);
    expect((await db.select().from(frames).where(and(eq(frames.id, gone.frameId), isNull(frames.purgedAt)))).length).toBe(0);
    expect(await exists(testApp.deps.storage, stuck.original)).toBe(true);

    const again = await preview(`olderThanDays=365&organisationId=${place.organisationId}`);
    expect(again.frameCount).toBe(1);
    const rerun = await sendJson(admin, 'post', '/api/storage/retention/purge', purgeBodyFrom(again));
    expect(rerun.body).toMatchObject({ purgedFrameCount: 1, failures: [] });
    expect(await exists(testApp.deps.storage, stuck.original)).toBe(false);
  });
});
