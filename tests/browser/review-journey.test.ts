/**
 * Review in a real browser (Debian's Chromium) against the built client:
 * a technician submits an analysed measurement, a reviewer returns it with a
 * comment, the technician submits again, the reviewer approves and issues
 * the certificate and downloads the PDF, whose SHA-256 must equal the one
 * the API stored. The measurement's analysis is a real engine result on the
 * project's synthetic bench (tests/api/review/review-bench.ts).
 */
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sha256Hex } from '../../server/certificates/verification-code';
import { runPoppler } from '../certificates/poppler';
import { createTestPerson, type TestPerson } from '../helpers/people';
import type { TestApp } from '../helpers/test-app';
import { createReviewBench, measurementStatusOf, stageMeasurement, type StagedMeasurement } from '../api/review/review-bench';
import { signInThroughPage, startBrowserStage, type BrowserStage } from './browser-pages';

let stage: BrowserStage | undefined;
let testApp: TestApp | undefined;
let baseUrl: string;
let technician: TestPerson;
let reviewer: TestPerson;
let staged: StagedMeasurement;
let page: Page;

beforeAll(async () => {
  stage = await startBrowserStage({ name: 'review-journey', screenshotFolder: 'review' });
  ({ testApp, baseUrl } = stage);
  const bench = await createReviewBench(testApp);
  technician = await createTestPerson(testApp.deps, { roles: ['technician'], name: 'Ilse Varnholt', emailPrefix: 'review-journey-technician' });
  reviewer = await createTestPerson(testApp.deps, { roles: ['reviewer'], name: 'Oren Castellane', emailPrefix: 'review-journey-reviewer' });
  staged = await stageMeasurement(testApp, bench, { performedById: technician.id, status: 'analysed' });
  page = await stage.browser.context.newPage();
}, 240_000);

afterAll(async () => {
  await stage?.close();
}, 60_000);

const screenshot = (name: string) => stage!.screenshot(page, name);
const signIn = (person: TestPerson) => signInThroughPage(page, baseUrl, person);

async function openMeasurement(): Promise<void> {
  await page.goto(`${baseUrl}/measurements/${staged.id}`);
  await page.getByRole('heading', { name: 'Review', exact: true }).waitFor();
}

describe('review journey in Chromium', () => {
  it('technician → reviewer returns → technician resubmits → reviewer approves and issues → the downloaded PDF matches the stored SHA-256', async () => {
    await signIn(technician);
    await openMeasurement();
    await screenshot('technician-before-submitting');
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await page.getByRole('list', { name: 'Review thread' }).getByText('Submitted analysis v1 for review.').waitFor();
    expect(await measurementStatusOf(testApp!, staged.id)).toBe('submitted');

    await signIn(reviewer);
    await page.goto(`${baseUrl}/review`);
    await page.getByRole('link', { name: staged.number }).first().click();
    await page.getByRole('heading', { name: 'Review', exact: true }).waitFor();
    await page.getByLabel('Return to the technician with a comment').fill('Please record which side of the lens faced the sensor.');
    await screenshot('reviewer-returning');
    await page.getByRole('button', { name: 'Return with comment' }).click();
    await page.getByRole('list', { name: 'Review thread' }).getByText('Please record which side of the lens faced the sensor.').waitFor();
    expect(await measurementStatusOf(testApp!, staged.id)).toBe('returned');

    await signIn(technician);
    await openMeasurement();
    await page.getByLabel('Add a comment').fill('Plane side faced the sensor; noted in the set-up.');
    await page.getByRole('button', { name: 'Post comment' }).click();
    await page.getByText('Plane side faced the sensor; noted in the set-up.').waitFor();
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await page.getByRole('button', { name: 'Submit for review' }).waitFor({ state: 'detached' });
    expect(await measurementStatusOf(testApp!, staged.id)).toBe('submitted');

    await signIn(reviewer);
    await page.goto(`${baseUrl}/review`);
    await page.getByRole('link', { name: staged.number }).first().waitFor();
    await screenshot('review-queue');
    await openMeasurement();
    await page.getByRole('button', { name: 'Approve' }).click();
    await page.getByRole('button', { name: 'Issue certificate' }).click();
    const downloadLink = page.getByRole('link', { name: /^Download C-\d{4}-\d{4,} rev 1$/ });
    await downloadLink.waitFor();
    await page.getByText(/certified and read-only/).waitFor();
    await screenshot('certified-with-certificate');

    const [download] = await Promise.all([page.waitForEvent('download'), downloadLink.click()]);
    const pdfPath = path.join(stage!.screenshotDir, 'review-journey-certificate.pdf');
    await download.saveAs(pdfPath);
    const pdf = await readFile(pdfPath);
    const listed = await (await page.request.get(`${baseUrl}/api/measurements/${staged.id}/certificates`)).json();
    expect(listed.certificates).toHaveLength(1);
    expect(sha256Hex(pdf)).toBe(listed.certificates[0].sha256);
    runPoppler('pdftoppm', ['-r', '60', '-png', pdfPath, path.join(stage!.screenshotDir, 'certificate-page')]);

    // The technician sees the certified measurement read-only: no analysis controls, no uploads.
    await signIn(technician);
    await openMeasurement();
    expect(await page.getByRole('button', { name: 'Submit for review' }).count()).toBe(0);
    expect(await page.getByRole('heading', { name: 'Analysis', exact: true }).count()).toBe(0);
    await screenshot('technician-certified-read-only');
  }, 240_000);
});
