/**
 * Review in a real browser (Debian's Chromium) against the built client:
 * a technician submits an analysed measurement, a reviewer returns it with a
 * comment, the technician submits again, the reviewer approves and issues
 * the certificate and downloads the PDF, whose SHA-256 must equal the one
 * the API stored. The measurement's analysis is a real engine result on the
 * project's synthetic bench (tests/api/review/review-bench.ts).
 */
import { mkdir, mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sha256Hex } from '../../server/certificates/verification-code';
import { runPoppler } from '../certificates/poppler';
import { createTestPerson, type TestPerson } from '../helpers/people';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { requireTestServices } from '../setup/test-services';
import { createReviewBench, measurementStatusOf, stageMeasurement, type StagedMeasurement } from '../api/review/review-bench';
import { buildClientOnce } from './build-client-once';
import { launchChromium, type RunningChromium } from './launch-chromium';
import { listenOnLoopback, type ListeningApp } from './listen-on-loopback';

const screenshotDir = '/tmp/shots/review';
let runDir: string;
let testApp: TestApp | undefined;
let listening: ListeningApp | undefined;
let browser: RunningChromium | undefined;
let technician: TestPerson;
let reviewer: TestPerson;
let staged: StagedMeasurement;
let page: Page;

beforeAll(async () => {
  requireTestServices();
  runDir = await mkdtemp(path.join(process.env.PARAXIA_TEST_SCRATCH_DIR ?? tmpdir(), 'review-journey-'));
  await mkdir(screenshotDir, { recursive: true });
  const client = await buildClientOnce({ scratchDir: process.env.PARAXIA_TEST_SCRATCH_DIR ?? runDir });
  testApp = createTestApp({ env: { CLIENT_DIST_DIR: client.distDir } });
  const bench = await createReviewBench(testApp);
  technician = await createTestPerson(testApp.deps, { roles: ['technician'], name: 'Ilse Varnholt', emailPrefix: 'review-journey-technician' });
  reviewer = await createTestPerson(testApp.deps, { roles: ['reviewer'], name: 'Oren Castellane', emailPrefix: 'review-journey-reviewer' });
  staged = await stageMeasurement(testApp, bench, { performedById: technician.id, status: 'analysed' });
  listening = await listenOnLoopback({ app: testApp.app });
  browser = await launchChromium({ scratchDir: runDir, actionTimeoutMs: 30_000 });
  page = await browser.context.newPage();
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
async function screenshot(name: string): Promise<void> {
  shotNumber += 1;
  await page.screenshot({ path: path.join(screenshotDir, `${String(shotNumber).padStart(2, '0')}-${name}.png`), fullPage: true });
}

async function signIn(person: TestPerson): Promise<void> {
  await page.goto(`${listening!.baseUrl}/`);
  const signOut = page.getByRole('button', { name: 'Sign out' });
  const signInHeading = page.getByRole('heading', { level: 1, name: 'Sign in' });
  await signOut.or(signInHeading).first().waitFor();
  if (await signOut.isVisible()) await signOut.click();
  await signInHeading.waitFor();
  await page.getByLabel('E-mail address').fill(person.email);
  await page.getByLabel('Password').fill(person.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('button', { name: 'Sign out' }).waitFor();
}

async function openMeasurement(): Promise<void> {
  await page.goto(`${listening!.baseUrl}/measurements/${staged.id}`);
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
    await page.goto(`${listening!.baseUrl}/review`);
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
    await page.goto(`${listening!.baseUrl}/review`);
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
    const pdfPath = path.join(screenshotDir, 'review-journey-certificate.pdf');
    await download.saveAs(pdfPath);
    const pdf = await readFile(pdfPath);
    const listed = await (await page.request.get(`${listening!.baseUrl}/api/measurements/${staged.id}/certificates`)).json();
    expect(listed.certificates).toHaveLength(1);
    expect(sha256Hex(pdf)).toBe(listed.certificates[0].sha256);
    runPoppler('pdftoppm', ['-r', '60', '-png', pdfPath, path.join(screenshotDir, 'certificate-page')]);

    // The technician sees the certified measurement read-only: no analysis controls, no uploads.
    await signIn(technician);
    await openMeasurement();
    expect(await page.getByRole('button', { name: 'Submit for review' }).count()).toBe(0);
    expect(await page.getByRole('heading', { name: 'Analysis', exact: true }).count()).toBe(0);
    await screenshot('technician-certified-read-only');
  }, 240_000);
});
