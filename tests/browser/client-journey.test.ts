/**
 * A client's journey in a real browser (Debian's Chromium) against the built
 * client and the real app: sign in, see the organisation's orders, open a
 * certified result, download the certificate, request new work; then an
 * anonymous visitor verifies the certificate's code and checks the
 * downloaded PDF. The certificates are inserted directly (two revisions of
 * one certificate), as the issuing code would leave them.
 */
import { createHash } from 'node:crypto';
import { readFile, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { lenses, outboundMail, workOrders } from '../../server/db/schema';
import { createTestOrganisation, createTestPerson, type TestPerson } from '../helpers/people';
import { insertCertifiedLens, type CertifiedLens } from '../api/verification/issued-certificate-fixture';
import { shown, signInThroughPage, startBrowserStage, watchForPageErrors, type BrowserStage } from './browser-pages';

let stage: BrowserStage | undefined;
let baseUrl: string;
let client: TestPerson;
let organisation: { id: string; name: string };
let certified: CertifiedLens;

beforeAll(async () => {
  stage = await startBrowserStage({ name: 'client-journey' });
  const { testApp } = stage;
  baseUrl = stage.baseUrl;
  organisation = await createTestOrganisation(testApp.deps, { kind: 'client', name: `Harrowgate Lens Works ${Date.now()}` });
  const lab = await createTestOrganisation(testApp.deps, { kind: 'lab' });
  await createTestPerson(testApp.deps, { roles: ['reviewer'], organisationId: lab.id });
  client = await createTestPerson(testApp.deps, { roles: ['client'], organisationId: organisation.id, name: 'Ilse Marchetti' });
  certified = await insertCertifiedLens(testApp.deps, { organisationId: organisation.id, organisationName: organisation.name, revisionCount: 2 });
  await insertCertifiedLens(testApp.deps, { organisationId: organisation.id, organisationName: organisation.name, revisionCount: 0, measurementStatus: 'submitted', workOrderId: certified.workOrderId });
}, 240_000);

afterAll(async () => {
  console.info(`client journey: screenshots in ${stage?.screenshotDir}`);
  await stage?.close();
}, 60_000);

describe('the client’s journey and public verification in a browser', () => {
  it('a client sees their order, downloads the current certificate byte for byte, requests new work; a visitor verifies the code and the PDF', async () => {
    if (!stage) throw new Error('beforeAll did not start the browser.');
    const { browser, testApp, runDir, screenshot } = stage;
    const page = await browser.context.newPage();
    const errors = watchForPageErrors(page);
    const current = certified.revisions[1];

    // 1. Sign in: a client lands on their orders.
    await signInThroughPage(page, baseUrl, client);
    await shown(page.getByRole('heading', { level: 1, name: 'Your orders and certificates' }));
    const order = await shown(page.locator(`[data-work-order="${certified.workOrderNumber}"]`));
    await screenshot(page, 'client-orders');

    // 2. The certified lens shows f ± U and the decision; the other lens only its stage.
    const lensRow = await shown(order.locator(`tr[data-lens="${certified.lensIdentifier}"]`));
    await shown(lensRow.getByText('Conforms', { exact: true }));
    await expect(lensRow.locator('[data-result] [data-quantity] .sr-only').textContent()).resolves.toMatch(/^100\.2\d* plus or minus 0\.\d+ millimetres$/);
    await shown(order.locator('[data-stage="in-review"]'));
    await shown(lensRow.getByText('superseded'));

    // 3. Download the current revision: the very bytes that were issued.
    const [download] = await Promise.all([page.waitForEvent('download'), lensRow.getByRole('link', { name: /Certificate .* rev\. 2 \(PDF\)/ }).click()]);
    const downloadedPath = path.join(runDir, 'downloaded-certificate.pdf');
    await download.saveAs(downloadedPath);
    const downloaded = await readFile(downloadedPath);
    expect(createHash('sha256').update(downloaded).digest('hex')).toBe(current.sha256);
    await screenshot(page, 'certified-result');

    // 4. Request new work: a missing nominal value is named beside its cell, then the request goes through.
    await page.getByRole('link', { name: 'Request new work' }).first().click();
    const form = await shown(page.getByRole('form', { name: 'Request new work' }));
    const title = `Spring batch of doublets ${Date.now()}`;
    await form.getByLabel('Title').fill(title);
    await form.getByLabel('Your reference (optional)').fill('PO-44120');
    await form.getByLabel('Lens 1 identifier').fill('DB-01');
    await form.getByLabel('Lens 1 description').fill('Cemented achromatic doublet, 30 mm');
    await form.getByLabel('Lens 1 nominal focal length in mm').fill('150');
    await form.getByLabel('Lens 1 tolerance', { exact: true }).fill('1');
    await form.getByRole('button', { name: '+ Add a lens' }).click();
    await form.getByLabel('Lens 2 identifier').fill('DB-02');
    await form.getByLabel('Lens 2 tolerance', { exact: true }).fill('0.8');
    await form.getByLabel('Lens 2 tolerance unit').selectOption('mm');
    await form.getByRole('button', { name: 'Send the request to the lab' }).click();
    await shown(form.getByText('Give the nominal focal length in mm (negative for a diverging lens).'));
    await screenshot(page, 'request-form-problem');
    await form.getByLabel('Lens 2 nominal focal length in mm').fill('-75');
    await form.getByRole('button', { name: 'Send the request to the lab' }).click();
    const notice = await shown(page.getByRole('status').filter({ hasText: 'Request sent: work order' }));
    const requestedNumber = /WO-\d{4}-\d+/.exec((await notice.textContent()) ?? '')?.[0];
    expect(requestedNumber).toBeDefined();
    await shown(page.locator(`[data-work-order="${requestedNumber}"]`));
    await screenshot(page, 'request-sent');

    const [requested] = await testApp.deps.db.select().from(workOrders).where(eq(workOrders.number, requestedNumber as string));
    expect(requested).toMatchObject({ title, status: 'requested', organisationId: organisation.id, clientReference: 'PO-44120' });
    const requestedLenses = await testApp.deps.db.select().from(lenses).where(eq(lenses.workOrderId, requested.id));
    expect(requestedLenses.map((lens) => [lens.identifier, lens.nominalFocalLengthMm, lens.tolerancePercent, lens.toleranceMm]).sort()).toEqual([
      ['DB-01', 150, 1, null],
      ['DB-02', -75, null, 0.8],
    ]);
    const labMail = await testApp.deps.db.select().from(outboundMail).where(and(eq(outboundMail.subjectType, 'work-order'), eq(outboundMail.subjectId, requested.id)));
    expect(labMail).toHaveLength(1);

    // 5. An anonymous visitor: the code from the certificate, then the downloaded PDF.
    await browser.context.clearCookies();
    const visitor = await browser.context.newPage();
    const visitorErrors = watchForPageErrors(visitor);
    await visitor.goto(`${baseUrl}/verify/${current.verificationCode}`);
    await shown(visitor.getByText('Genuine and current', { exact: true }));
    await shown(visitor.getByText(certified.lensIdentifier));
    await screenshot(visitor, 'verify-current');
    await visitor.locator('[data-role="certificate-file-input"]').setInputFiles(downloadedPath);
    await shown(visitor.locator('[data-file-check="match"]'));
    await screenshot(visitor, 'verify-file-match');

    // A changed byte is caught.
    const tamperedPath = path.join(runDir, 'tampered-certificate.pdf');
    const tampered = Buffer.from(downloaded);
    tampered[Math.floor(tampered.length / 2)] ^= 0x01;
    await writeFile(tamperedPath, tampered);
    await visitor.locator('[data-role="certificate-file-input"]').setInputFiles(tamperedPath);
    await shown(visitor.locator('[data-file-check="mismatch"]'));
    await screenshot(visitor, 'verify-file-tampered');

    // The first revision's code: genuine, superseded by revision 2; a typed unknown code: no certificate.
    await visitor.goto(`${baseUrl}/verify`);
    await visitor.getByRole('textbox', { name: 'Verification code' }).fill(certified.revisions[0].verificationCode.toLowerCase());
    await visitor.getByRole('button', { name: 'Verify' }).click();
    const superseded = await shown(visitor.locator('[data-verdict="superseded"]'));
    await expect(superseded.textContent()).resolves.toContain('by revision 2');
    await screenshot(visitor, 'verify-superseded');
    await visitor.goto(`${baseUrl}/verify/2345-6789-ABCD`);
    await shown(visitor.getByText('No certificate with this code', { exact: true }));
    await screenshot(visitor, 'verify-unknown');

    expect(errors).toEqual([]);
    expect(visitorErrors).toEqual([]);
    await rm(tamperedPath, { force: true });
  }, 180_000);
});
