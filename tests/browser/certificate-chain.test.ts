/**
 * The whole certificate chain in a real browser (Debian's Chromium) against
 * the built client, with no shortcut rows after the analysis: a technician
 * submits an analysed measurement, a second person reviews, approves and
 * issues the certificate, the client of the work order's organisation is
 * told by e-mail, finds the result on /orders and downloads the PDF, and an
 * anonymous visitor follows the verification link printed in that PDF and
 * checks the file (and a one-byte-tampered copy). The analysis is a real
 * engine result on the project's synthetic bench, staged the way the review
 * journey stages it (tests/api/review/review-bench.ts).
 *
 * The app is told its own loopback address as PUBLIC_BASE_URL, so the link
 * in the PDF and in the mail is the one the visitor's browser opens.
 */
import { readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { and, asc, eq } from 'drizzle-orm';
import { simpleParser, type ParsedMail } from 'mailparser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sha256Hex } from '../../server/certificates/verification-code';
import { auditEvents, certificates, outboundMail } from '../../server/db/schema';
import { createLogger } from '../../server/services/logger';
import { readMailIndex, readStoredMailSource } from '../../server/services/mail-store';
import { dispatchDueMail } from '../../server/services/outbound-mail/dispatch-due-mail';
import { flowText, pdfPagesText, runPoppler } from '../certificates/poppler';
import { createTestPerson, type TestPerson } from '../helpers/people';
import type { TestApp } from '../helpers/test-app';
import { createReviewBench, measurementStatusOf, stageMeasurement, type ReviewBench, type StagedMeasurement } from '../api/review/review-bench';
import { shown, signInThroughPage, startBrowserStage, watchForPageErrors, type BrowserStage } from './browser-pages';

let stage: BrowserStage | undefined;
let testApp: TestApp | undefined;
let baseUrl: string;
let bench: ReviewBench;
let technician: TestPerson;
let reviewer: TestPerson;
let client: TestPerson;
let staged: StagedMeasurement;

beforeAll(async () => {
  stage = await startBrowserStage({ name: 'certificate-chain', screenshotFolder: 'chain', tellAppItsAddress: true });
  ({ testApp, baseUrl } = stage);
  bench = await createReviewBench(testApp);
  technician = await createTestPerson(testApp.deps, { roles: ['technician'], name: 'Maren Oakhurst', emailPrefix: 'chain-technician' });
  reviewer = await createTestPerson(testApp.deps, { roles: ['reviewer'], name: 'Teodor Vasquill', emailPrefix: 'chain-reviewer' });
  client = await createTestPerson(testApp.deps, { roles: ['client'], organisationId: bench.organisation.id, name: 'Priya Lindqvist', emailPrefix: 'chain-client' });
  staged = await stageMeasurement(testApp, bench, { performedById: technician.id, status: 'analysed' });
}, 240_000);

afterAll(async () => {
  await stage?.close();
}, 60_000);

/** What the fake SMTP server kept with exactly this subject, parsed. */
async function receivedWithSubject(subject: string): Promise<{ envelopeTo: string[]; parsed: ParsedMail }[]> {
  const dir = testApp!.deps.env.MAIL_STORE_DIR;
  const entries = (await readMailIndex(dir)).filter((entry) => entry.subject === subject);
  return Promise.all(entries.map(async (entry) => ({ envelopeTo: entry.envelopeTo, parsed: await simpleParser(await readStoredMailSource(dir, entry)) })));
}

describe('the certificate chain in Chromium', () => {
  it('technician submits → another person approves and issues → the client is mailed, downloads the PDF byte for byte → a visitor following the PDF’s link sees it genuine and current, the file matching and a tampered copy not', async () => {
    if (!stage || !testApp) throw new Error('beforeAll did not start the browser.');
    const { browser, screenshot, screenshotDir, runDir } = stage;
    const { db } = testApp.deps;
    const errors: string[] = [];
    const page = await browser.context.newPage();
    watchForPageErrors(page, errors);

    // 1. The technician submits the analysed measurement.
    await signInThroughPage(page, baseUrl, technician);
    await page.goto(`${baseUrl}/measurements/${staged.id}`);
    await shown(page.getByRole('heading', { name: 'Review', exact: true }));
    await screenshot(page, 'technician-analysed');
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await shown(page.getByRole('list', { name: 'Review thread' }).getByText('Submitted analysis v1 for review.'));
    expect(await measurementStatusOf(testApp, staged.id)).toBe('submitted');
    await screenshot(page, 'technician-submitted');

    // 2. A reviewer (not the performer) finds it in the queue, approves it and issues the certificate.
    await signInThroughPage(page, baseUrl, reviewer);
    await page.goto(`${baseUrl}/review`);
    const queued = await shown(page.getByRole('link', { name: staged.number }).first());
    await screenshot(page, 'reviewer-queue');
    await queued.click();
    await shown(page.getByRole('heading', { name: 'Review', exact: true }));
    await page.getByRole('button', { name: 'Approve' }).click();
    const issue = await shown(page.getByRole('button', { name: 'Issue certificate' }));
    expect(await measurementStatusOf(testApp, staged.id)).toBe('approved');
    await screenshot(page, 'reviewer-approved');
    await issue.click();
    await shown(page.getByRole('link', { name: /^Download C-\d{4}-\d{4,} rev 1$/ }));
    await shown(page.getByText(/certified and read-only/));
    await screenshot(page, 'reviewer-certified');
    expect(await measurementStatusOf(testApp, staged.id)).toBe('certified');

    const issued = await db.select().from(certificates).where(eq(certificates.measurementId, staged.id));
    expect(issued).toHaveLength(1);
    const [certificate] = issued;
    expect(certificate).toMatchObject({ revision: 1, status: 'current', organisationId: bench.organisation.id, issuedById: reviewer.id });

    // Every transition is in the audit log, by the person who made it.
    const trail = await db
      .select({ action: auditEvents.action, actorId: auditEvents.actorId })
      .from(auditEvents)
      .where(and(eq(auditEvents.subjectType, 'measurement'), eq(auditEvents.subjectId, staged.id)))
      .orderBy(asc(auditEvents.id));
    expect(trail).toEqual([
      { action: 'measurement.submitted', actorId: technician.id },
      { action: 'measurement.approved', actorId: reviewer.id },
      { action: 'measurement.certified', actorId: reviewer.id },
    ]);

    // 3. The "certificate issued" mail was queued in the issuing transaction; dispatched, the fake SMTP server holds it for the client.
    const queuedMail = await db
      .select()
      .from(outboundMail)
      .where(and(eq(outboundMail.subjectType, 'certificate'), eq(outboundMail.subjectId, certificate.id)));
    expect(queuedMail).toHaveLength(1);
    expect(queuedMail[0]).toMatchObject({ kind: 'certificate-issued', status: 'queued' });
    expect(queuedMail[0].toAddresses).toContain(client.email);
    const log = createLogger({ level: 'silent', name: 'certificate-chain' });
    expect(await dispatchDueMail({ db, mailer: testApp.deps.mailer, log }, { mailIds: [queuedMail[0].id] })).toEqual({ sent: 1, retried: 0, failed: 0 });
    const received = await receivedWithSubject(queuedMail[0].subject);
    expect(received).toHaveLength(1);
    expect(received[0].envelopeTo).toContain(client.email);
    const mailText = received[0].parsed.text ?? '';
    const mailLinks = [...mailText.matchAll(/https?:\/\/\S+\/verify\/[23456789A-Z-]+/g)].map((match) => match[0]);
    expect(mailLinks.length).toBeGreaterThan(0);
    expect(new Set(mailLinks).size).toBe(1);
    expect(received[0].parsed.html).toContain(`href="${mailLinks[0]}"`);

    // 4. The client signs in, finds the certified result on /orders and downloads the PDF through the page.
    await signInThroughPage(page, baseUrl, client);
    await page.goto(`${baseUrl}/orders`);
    await shown(page.getByRole('heading', { level: 1, name: 'Your orders and certificates' }));
    const order = await shown(page.locator(`[data-work-order="${bench.workOrder.number}"]`));
    const lensRow = await shown(order.locator(`tr[data-lens="${bench.lens.identifier}"]`));
    await shown(lensRow.locator('[data-stage="certified"]'));
    await shown(lensRow.getByText(staged.number));
    // The portal shows the analysis's own f ± U (Quantity's spoken form), not a value typed here.
    const spoken = (await lensRow.locator('[data-result] [data-quantity] .sr-only').textContent()) ?? '';
    const spokenMatch = /^(-?\d+(?:\.\d+)?) plus or minus (\d+(?:\.\d+)?) millimetres$/.exec(spoken);
    expect(spokenMatch, `the result cell reads "${spoken}"`).not.toBeNull();
    expect(Number(spokenMatch![1])).toBeCloseTo(bench.result.focalLengthMm, 1);
    expect(Number(spokenMatch![2])).toBeCloseTo(bench.result.expandedUncertaintyMm, 2);
    // Guarded acceptance with w = U (ILAC-G8:09/2019): f ± U wholly inside nominal ± 2 % conforms. The staged lens is 101 mm ± 2 %.
    const toleranceMm = (bench.lens.tolerancePercent! / 100) * bench.lens.nominalFocalLengthMm;
    expect(Math.abs(bench.result.focalLengthMm - bench.lens.nominalFocalLengthMm) + bench.result.expandedUncertaintyMm).toBeLessThan(toleranceMm);
    await shown(lensRow.getByText('Conforms', { exact: true }));
    await screenshot(page, 'client-orders');

    const downloadLink = lensRow.getByRole('link', { name: new RegExp(`^Certificate ${certificate.number} rev\\. 1 \\(PDF\\)$`) });
    const [download] = await Promise.all([page.waitForEvent('download'), downloadLink.click()]);
    const pdfPath = path.join(screenshotDir, 'client-downloaded-certificate.pdf');
    await download.saveAs(pdfPath);
    const pdf = await readFile(pdfPath);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(pdf.length).toBe(certificate.byteSize);
    expect(sha256Hex(pdf)).toBe(certificate.sha256);
    const apiDownload = await page.request.get(`${baseUrl}${new URL((await downloadLink.getAttribute('href')) ?? '', baseUrl).pathname}`);
    expect(apiDownload.status()).toBe(200);
    expect(apiDownload.headers()['x-content-sha256']).toBe(sha256Hex(pdf));
    runPoppler('pdftoppm', ['-r', '60', '-png', '-f', '1', '-l', '1', pdfPath, path.join(screenshotDir, 'certificate-page')]);

    // The verification link printed in the PDF: this app's address and this certificate's code, and the same as the mail's.
    const pdfText = flowText(pdfPagesText(pdfPath).join(' '));
    const printedLinks = [...pdfText.matchAll(/https?:\/\/\S+\/verify\/[23456789A-Z-]+/g)].map((match) => match[0]);
    expect(printedLinks.length).toBeGreaterThan(0);
    expect(new Set(printedLinks)).toEqual(new Set([`${baseUrl}/verify/${certificate.verificationCode}`]));
    expect(mailLinks[0]).toBe(printedLinks[0]);
    expect(pdfText).toContain(certificate.number);
    expect(pdfText).toContain(bench.lens.identifier);
    expect(pdfText).toContain(reviewer.name);
    expect(pdfText).toContain(technician.name);
    expect(pdfText).toContain('Conforms.');

    // 5. An anonymous visitor opens the printed link: genuine and current; the downloaded PDF matches, a tampered copy does not.
    await page.getByRole('button', { name: 'Sign out' }).click();
    await shown(page.getByRole('heading', { level: 1, name: 'Sign in' }));
    await page.close();
    await browser.context.clearCookies();
    const visitor = await browser.context.newPage();
    watchForPageErrors(visitor, errors);
    expect((await visitor.request.get(`${baseUrl}/api/auth/me`)).status()).toBe(401);
    await visitor.goto(printedLinks[0]);
    const verdict = await shown(visitor.locator('[data-verdict="current"]'));
    await shown(verdict.getByText('Genuine and current', { exact: true }));
    const facts = visitor.getByRole('region', { name: 'Verification result' }).locator('dl');
    await shown(facts.getByText(certificate.number));
    await shown(facts.getByText(bench.lens.identifier));
    await screenshot(visitor, 'visitor-genuine-current');

    await visitor.locator('[data-role="certificate-file-input"]').setInputFiles(pdfPath);
    const match = await shown(visitor.locator('[data-file-check="match"]'));
    await expect(match.textContent()).resolves.toContain(certificate.sha256);
    await screenshot(visitor, 'visitor-file-matches');

    const tamperedPath = path.join(runDir, 'tampered-certificate.pdf');
    const tampered = Buffer.from(pdf);
    tampered[Math.floor(tampered.length / 2)] ^= 0x01;
    await writeFile(tamperedPath, tampered);
    await visitor.locator('[data-role="certificate-file-input"]').setInputFiles(tamperedPath);
    const mismatch = await shown(visitor.locator('[data-file-check="mismatch"]'));
    await expect(mismatch.textContent()).resolves.toContain(sha256Hex(tampered));
    expect(await visitor.locator('[data-file-check="match"]').count()).toBe(0);
    await screenshot(visitor, 'visitor-tampered-copy');

    expect(errors).toEqual([]);
  }, 120_000);
});
