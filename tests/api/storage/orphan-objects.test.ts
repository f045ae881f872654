import { randomBytes, randomUUID } from 'node:crypto';
import { and, desc, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { OrphanList, OrphanRemovalResult } from '../../../shared/schemas/storage';
import { auditEvents, frames } from '../../../server/db/schema';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { sendJson } from '../catalogue/catalogue-fixtures';
import { createStoredOrganisation, putFiller, type StoredOrganisation } from './storage-layout';

/** The app as configured by default (orphans must be an hour old) and one that offers objects at any age. */
let usualApp: TestApp;
let anyAgeApp: TestApp;
let usualAdmin: SignedInSession;
let admin: SignedInSession;
let place: StoredOrganisation;
let strayFrameKey: string;
let strayOrganisationKey: string;

beforeAll(async () => {
  usualApp = createTestApp();
  // The handlers take the setting from the app's environment when it is built; only the second app sees 0.
  anyAgeApp = createTestApp({ env: { PARAXIA_ORPHAN_MIN_AGE_MINUTES: '0' } });
  [usualAdmin, admin] = await Promise.all([signedInWithRoles(usualApp, ['admin']), signedInWithRoles(anyAgeApp, ['admin'])]);
  place = await createStoredOrganisation(usualApp.deps, [[{ status: 'certified', frameCount: 2, certificateIssuedDaysAgo: [3] }]]);
  const measurement = place.workOrders[0].measurements[0];
  const sweepPrefix = measurement.frames[0].original.split('/').slice(0, -2).join('/');
  strayFrameKey = `${sweepPrefix}/${randomUUID()}/original.png`;
  strayOrganisationKey = `${place.prefix}left-over-${randomBytes(3).toString('hex')}.bin`;
  await Promise.all([putFiller(usualApp.deps, strayFrameKey, 2345, 'image/png'), putFiller(usualApp.deps, strayOrganisationKey, 678)]);
});

afterAll(async () => {
  await Promise.all([usualApp?.close(), anyAgeApp?.close()]);
});

async function listOrphans(session: SignedInSession): Promise<OrphanList> {
  const response = await session.agent.get(`/api/storage/orphans?organisationId=${place.organisationId}`);
  expect(response.status, JSON.stringify(response.body)).toBe(200);
  return response.body as OrphanList;
}

describe('orphan objects', () => {
  it('objects younger than the minimum age are counted but not offered', async () => {
    const list = await listOrphans(usualAdmin);
    expect(list.minimumAgeMinutes).toBe(60);
    expect(list.orphans).toEqual([]);
    expect(list.youngSkippedCount).toBe(2);
    // 2 frames × 3 objects, 1 certificate, 2 strays.
    expect(list.scannedObjectCount).toBe(9);
  });

  it('lists exactly the objects no frame or certificate points at, with size and last-modified time', async () => {
    const list = await listOrphans(admin);
    expect(list.orphans.map((orphan) => orphan.key).sort()).toEqual([strayFrameKey, strayOrganisationKey].sort());
    expect(list.orphanCount).toBe(2);
    expect(list.orphanBytes).toBe(2345 + 678);
    const frameOrphan = list.orphans.find((orphan) => orphan.key === strayFrameKey)!;
    expect(frameOrphan.sizeBytes).toBe(2345);
    expect(Number.isNaN(Date.parse(frameOrphan.lastModified!))).toBe(false);
  });

  it('removal re-checks each key: one that gained a record is kept, a true orphan is removed, and the audit event names what went', async () => {
    // The stray frame object gains its row between the listing and the removal.
    const sweepId = (await anyAgeApp.deps.db.select().from(frames).where(eq(frames.id, place.workOrders[0].measurements[0].frames[0].frameId)))[0].sweepId;
    await anyAgeApp.deps.db.insert(frames).values({
      sweepId,
      fileName: 'late-arrival.png',
      objectKey: strayFrameKey,
      contentType: 'image/png',
      byteSize: 2345,
      widthPx: 64,
      heightPx: 48,
      bitDepth: 8,
      sha256: randomBytes(32).toString('hex'),
    });
    const missingKey = `${place.prefix}never-existed.bin`;
    const response = await sendJson(admin, 'post', '/api/storage/orphans/removal', { keys: [strayFrameKey, strayOrganisationKey, missingKey] });
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    const result = response.body as OrphanRemovalResult;
    expect(result.removed).toEqual([{ key: strayOrganisationKey, sizeBytes: 678 }]);
    expect(result.removedBytes).toBe(678);
    expect(result.kept).toEqual(
      expect.arrayContaining([
        { key: strayFrameKey, reason: 'has-record' },
        { key: missingKey, reason: 'missing' },
      ]),
    );
    expect(await anyAgeApp.deps.storage.headObject(strayFrameKey)).not.toBeNull();
    expect(await anyAgeApp.deps.storage.headObject(strayOrganisationKey)).toBeNull();
    for (const frame of place.workOrders[0].measurements[0].frames) expect(await anyAgeApp.deps.storage.headObject(frame.original)).not.toBeNull();

    const [event] = await anyAgeApp.deps.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.action, 'storage.orphans-removed'), eq(auditEvents.actorId, admin.person.id)))
      .orderBy(desc(auditEvents.id));
    expect(event.details).toMatchObject({ removedCount: 1, removedBytes: 678, keys: [strayOrganisationKey] });
    expect((await listOrphans(admin)).orphans).toEqual([]);
  });

  it('removal keeps an object younger than the minimum age, and writes no audit event when nothing went', async () => {
    const youngKey = `${place.prefix}just-uploaded-${randomBytes(3).toString('hex')}.bin`;
    await putFiller(usualApp.deps, youngKey, 55);
    const response = await sendJson(usualAdmin, 'post', '/api/storage/orphans/removal', { keys: [youngKey] });
    expect(response.body).toEqual({ removedCount: 0, removedBytes: 0, removed: [], kept: [{ key: youngKey, reason: 'too-young' }] });
    expect(await usualApp.deps.storage.headObject(youngKey)).not.toBeNull();
    const events = await usualApp.deps.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.action, 'storage.orphans-removed'), eq(auditEvents.actorId, usualAdmin.person.id)));
    expect(events).toEqual([]);
  });

  it('refuses an empty or repeated key list with a sentence', async () => {
    const empty = await sendJson(admin, 'post', '/api/storage/orphans/removal', { keys: [] });
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields.keys).toBe('Field "keys" must name at least one object.');
    const twice = await sendJson(admin, 'post', '/api/storage/orphans/removal', { keys: ['a', 'a'] });
    expect(twice.status).toBe(400);
    expect(twice.body.error.fields.keys).toBe('Field "keys" names the same object twice.');
  });
});
