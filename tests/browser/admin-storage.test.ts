/**
 * An admin's storage page in a real browser (Debian's Chromium): the use
 * tables, a retention preview and purge, and the removal of an object without
 * a record, against the real app, PostgreSQL and fake S3 of `npm test`. Every
 * step is scoped to this file's own client organisation, because other test
 * files share the bucket. Screenshots go to PARAXIA_TEST_SCREENSHOT_DIR or
 * /tmp/shots/storage.
 */
import { mkdir, mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestPerson, type TestPerson } from '../helpers/people';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { requireTestServices } from '../setup/test-services';
import { createStoredOrganisation, putFiller, type StoredOrganisation } from '../api/storage/storage-layout';
import { buildClientOnce } from './build-client-once';
import { launchChromium, type RunningChromium } from './launch-chromium';
import { listenOnLoopback, type ListeningApp } from './listen-on-loopback';

// Objects of any age are offered here, so the object made a moment ago can be shown and removed.
process.env.PARAXIA_ORPHAN_MIN_AGE_MINUTES = '0';

let runDir: string;
let screenshotDir: string;
let testApp: TestApp | undefined;
let listening: ListeningApp | undefined;
let browser: RunningChromium | undefined;
let admin: TestPerson;
let place: StoredOrganisation;
let strayKey: string;

beforeAll(async () => {
  requireTestServices();
  const scratchRoot = process.env.PARAXIA_TEST_SCRATCH_DIR ?? tmpdir();
  runDir = await mkdtemp(path.join(scratchRoot, 'admin-storage-'));
  screenshotDir = process.env.PARAXIA_TEST_SCREENSHOT_DIR ?? '/tmp/shots/storage';
  await mkdir(screenshotDir, { recursive: true });
  const client = await buildClientOnce({ scratchDir: process.env.PARAXIA_TEST_SCRATCH_DIR ?? runDir });
  testApp = createTestApp({ env: { CLIENT_DIST_DIR: client.distDir } });
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
  listening = await listenOnLoopback({ app: testApp.app });
  browser = await launchChromium({ scratchDir: runDir, actionTimeoutMs: 30_000 });
}, 240_000);

afterAll(async () => {
  const problems: unknown[] = [];
  for (const close of [() => browser?.close(), () => listening?.close(), () => testApp?.close()]) {
    try {
      await close();
    } catch (error) {
      problems.push(error);
    }
  }
  if (runDir) await rm(runDir, { recursive: true, force: true });
  if (problems.length > 0) throw problems[0];
}, 60_000);

let shotNumber = 0;
/** A picture of each step for people reading a run; never asserted. */
async function screenshot(page: Page, name: string): Promise<void> {
  shotNumber += 1;
  const file = path.join(screenshotDir, `${String(shotNumber).padStart(2, '0')}-${name}.png`);
  await page.screenshot({ path: file, fullPage: true }).catch((error: Error) => console.warn(`Screenshot ${file} failed: ${error.message}`));
}

async function shown(locator: Locator): Promise<Locator> {
  await locator.waitFor({ state: 'visible' });
  return locator;
}

describe('admin storage page', () => {
  it('shows use for one organisation, purges the previewed raw frames after a confirmation and removes an object without a record', async () => {
    const page = await browser!.context.newPage();
    await page.goto(`${listening!.baseUrl}/sign-in`);
    await page.getByLabel('E-mail address').fill(admin.email);
    await page.getByLabel('Password').fill(admin.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));

    await page.goto(`${listening!.baseUrl}/admin/storage?organisation=${place.organisationId}`);
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
