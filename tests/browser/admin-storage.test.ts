/**
 * An admin's storage page in a real browser (Debian's Chromium): the use
 * tables, a retention preview and purge, and the removal of an object without
 * a record, against the real app, PostgreSQL and fake S3 of `npm test`. Every
 * step is scoped to this file's own client organisation, because other test
 * files share the bucket. Screenshots go to /tmp/shots/storage (or a
 * folder of that name in PARAXIA_TEST_SCREENSHOT_DIR).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestPerson, type TestPerson } from '../helpers/people';
import type { TestApp } from '../helpers/test-app';
import { createStoredOrganisation, putFiller, type StoredOrganisation } from '../api/storage/storage-layout';
import { shown, signInThroughPage, startBrowserStage, type BrowserStage } from './browser-pages';

let stage: BrowserStage | undefined;
let testApp: TestApp | undefined;
let admin: TestPerson;
let place: StoredOrganisation;
let strayKey: string;

beforeAll(async () => {
  stage = await startBrowserStage({
    name: 'admin-storage',
    screenshotFolder: 'storage',
    // Objects of any age are offered here, so the object made a moment ago can be shown and removed.
    env: { PARAXIA_ORPHAN_MIN_AGE_MINUTES: '0' },
  });
  testApp = stage.testApp;
  admin = await createTestPerson(testApp.deps, { roles: ['admin'] });
  place = await createStoredOrganisation(testApp.deps, [
    [
      { status: 'certified', frameCount: 3, certificateIssuedDaysAgo: [420, 12] },
      { status: 'certified', frameCount: 2, certificateIssuedDaysAgo: [25] },
    ],
    [{ status: 'approved', frameCount: 2, approvedDaysAgo: 500 }],
  ]);
  strayKey = `${place.workOrders[0].prefix}interrupted-upload.bin`;
  await putFiller(testApp.deps, strayKey, 48_000);
}, 240_000);

afterAll(async () => {
  await stage?.close();
}, 60_000);

describe('admin storage page', () => {
  it('shows use for one organisation, purges the previewed raw frames after a confirmation and removes an object without a record', async () => {
    const { browser, baseUrl, screenshot } = stage!;
    const page = await browser.context.newPage();
    await signInThroughPage(page, baseUrl, admin);
    expect(new URL(page.url()).pathname.startsWith('/sign-in')).toBe(false);

    await page.goto(`${baseUrl}/admin/storage?organisation=${place.organisationId}`);
    await shown(page.getByRole('heading', { level: 1, name: 'Storage and retention' }));
    await shown(page.locator('[data-testid="storage-use"]:not([data-stale])'));
    const workOrderTable = page.getByRole('table', { name: /By work order/ });
    await shown(workOrderTable.getByText(place.workOrders[0].number));
    await expect(page.getByLabel('Scope').inputValue()).resolves.toBe(place.organisationId);
    await screenshot(page, 'use-one-organisation');

    // Retention: preview with the default N (365 days), then confirm.
    await expect(page.getByLabel('N, days since first certificate').inputValue()).resolves.toBe('365');
    await page.getByRole('button', { name: 'Preview' }).click();
    const preview = await shown(page.getByTestId('retention-preview'));
    await shown(preview.getByText(place.workOrders[0].measurements[0].number));
    // The header row and one measurement: the recent and the approved-only ones are not in the set.
    expect(await preview.getByRole('row').count()).toBe(2);
    await screenshot(page, 'retention-preview');
    await page.getByRole('button', { name: 'Purge these raw frames…' }).click();
    const dialog = await shown(page.getByRole('dialog', { name: 'Purge raw frames?' }));
    await screenshot(page, 'retention-confirm');
    await dialog.getByRole('button', { name: 'Purge 3 raw frames' }).click();
    await shown(page.getByRole('status').filter({ hasText: 'Purged 3 raw frames of 1 measurement,' }));
    await screenshot(page, 'retention-done');
    for (const frame of place.workOrders[0].measurements[0].frames) {
      expect(await testApp!.deps.storage.headObject(frame.original)).toBeNull();
      expect(await testApp!.deps.storage.headObject(frame.thumbnail)).not.toBeNull();
    }
    for (const frame of place.workOrders[0].measurements[1].frames) expect(await testApp!.deps.storage.headObject(frame.original)).not.toBeNull();

    // Orphans: find, confirm, removed.
    await page.getByRole('button', { name: 'Look for objects without a record' }).click();
    const list = await shown(page.getByTestId('orphan-list'));
    await shown(list.getByText(strayKey));
    await screenshot(page, 'orphans-found');
    await page.getByRole('button', { name: 'Remove listed objects…' }).click();
    const removal = await shown(page.getByRole('dialog', { name: 'Remove objects without a record?' }));
    await removal.getByRole('button', { name: 'Remove 1 object' }).click();
    await shown(page.getByRole('status').filter({ hasText: 'Removed 1 object,' }));
    expect(await testApp!.deps.storage.headObject(strayKey)).toBeNull();
    await screenshot(page, 'orphans-removed');

    // All storage: the organisation table lists this client among others.
    await page.getByLabel('Scope').selectOption('');
    await shown(page.locator('[data-testid="storage-use"]:not([data-stale])'));
    await shown(page.getByRole('table', { name: 'By organisation' }).getByText(place.name));
    await screenshot(page, 'use-all-storage');
    await page.close();
  }, 180_000);
});
