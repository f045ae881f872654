/**
 * Issuing, reissuing and downloading certificates through the API, the PDF
 * read back with poppler's pdftotext and checked against ISO/IEC 17025:2017
 * §7.8's list (methods.md §9) and against the measurement's own records.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatMeasuredValue, formatPercent } from '../../../server/certificates/certificate-numbers';
import { decisionRuleNames, decisionWords } from '../../../server/certificates/certificate-wording';
import { sha256Hex } from '../../../server/certificates/verification-code';
import { auditEvents, certificates, measurements, organisationContacts, workOrders } from '../../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../../server/middleware/csrf';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { createTestOrganisation, uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { flowText, pdfPagesText, runPoppler } from '../../certificates/poppler';
import { createTestLens, createTestWorkOrder } from '../measurements/bench-records';
import { createReviewBench, stageMeasurement, type ReviewBench } from '../review/review-bench';

let testApp: TestApp;
let bench: ReviewBench;
let technician: SignedInSession;
let reviewer: SignedInSession;
let admin: SignedInSession;
let ownClient: SignedInSession;
let otherClient: SignedInSession;
let measurementId: string;
let measurementNumber: string;
let first: { id: string; number: string; revision: number; sha256: string; verificationCode: string; pageCount: number };
let firstPdf: Buffer;
let pages: string[];
let flow: string;
let lab: { id: string; name: string };
let refusedWithoutAddress: { status: number; body: { error?: { message?: string } } };
let certificateRowsAfterRefusal: number;
const folder = '/tmp/shots/review';

function post(session: SignedInSession, url: string, body: object = {}) {
  return session.agent.post(url).set(CSRF_HEADER_NAME, session.csrfToken).send(body);
}

async function download(session: SignedInSession, certificateId: string) {
  return session.agent
    .get(`/api/certificates/${certificateId}/pdf`)
    .buffer(true)
    .parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
}

function readPdf(name: string, pdf: Buffer): string[] {
  mkdirSync(folder, { recursive: true });
  const file = path.join(folder, `${name}.pdf`);
  writeFileSync(file, pdf);
  return pdfPagesText(file);
}

beforeAll(async () => {
  testApp = createTestApp();
  bench = await createReviewBench(testApp);
  await testApp.deps.db.insert(organisationContacts).values({
    organisationId: bench.organisation.id,
    name: 'Maren Ostrowe',
    email: `maren-${uniqueSuffix()}@bright-optics.example`,
    position: 'Quality manager',
  });
  // The approver's own lab, with no address recorded yet: the first issue is refused until an admin enters it.
  lab = await createTestOrganisation(testApp.deps, { kind: 'lab', postalAddress: '' });
  technician = await signedInWithRoles(testApp, ['technician'], { organisationId: lab.id });
  reviewer = await signedInWithRoles(testApp, ['reviewer'], { organisationId: lab.id });
  admin = await signedInWithRoles(testApp, ['admin'], { organisationId: lab.id });
  ownClient = await signedInWithRoles(testApp, ['client'], { organisationId: bench.organisation.id });
  otherClient = await signedInWithRoles(testApp, ['client'], { organisationId: (await createTestOrganisation(testApp.deps, { kind: 'client' })).id });

  const staged = await stageMeasurement(testApp, bench, { performedById: technician.person.id, status: 'analysed' });
  measurementId = staged.id;
  measurementNumber = staged.number;
  expect((await post(technician, `/api/measurements/${measurementId}/submission`)).status).toBe(200);
  expect((await post(reviewer, `/api/measurements/${measurementId}/approval`)).status).toBe(200);
  refusedWithoutAddress = await post(admin, `/api/measurements/${measurementId}/certificates`);
  certificateRowsAfterRefusal = (await testApp.deps.db.select().from(certificates).where(eq(certificates.measurementId, measurementId))).length;
  const patch = (id: string, body: object) => admin.agent.patch(`/api/organisations/${id}`).set(CSRF_HEADER_NAME, admin.csrfToken).send(body);
  expect((await patch(lab.id, { name: lab.name, postalAddress: ' 12 Ravelin Yard \n\nOstmoor OS4 7RY, Examplia', email: 'Certs@Ravelin.example', phone: '+00 555 0142' })).status).toBe(200);
  expect((await patch(bench.organisation.id, { name: bench.organisation.name, postalAddress: 'Receiving dock 2\nBrightwater BW9 1CL, Examplia' })).status).toBe(200);
  const issued = await post(admin, `/api/measurements/${measurementId}/certificates`);
  expect(issued.status, JSON.stringify(issued.body)).toBe(201);
  first = issued.body.certificate;
  const downloaded = await download(technician, first.id);
  expect(downloaded.status).toBe(200);
  firstPdf = downloaded.body as Buffer;
  pages = readPdf('api-certificate-r1', firstPdf);
  flow = flowText(pages.join('\n'));
}, 180_000);

afterAll(async () => {
  await testApp?.close();
});

describe('POST /api/measurements/:id/certificates', () => {
  it('refuses to issue while the issuing lab has no address recorded, saying where to enter it, and writes nothing', () => {
    expect(refusedWithoutAddress.status).toBe(409);
    expect(refusedWithoutAddress.body.error?.message).toBe(
      `A certificate must state the laboratory’s address (ISO/IEC 17025 §7.8.2.1), and ${lab.name} has none recorded; an administrator can enter it under Administration → Organisations, then issue again.`,
    );
    expect(certificateRowsAfterRefusal).toBe(0);
  });

  it('prints the lab’s address, e-mail and phone and the client’s postal address as entered under Organisations (lines trimmed, blank ones dropped)', () => {
    expect(flow).toContain('12 Ravelin Yard');
    expect(flow).toContain('Ostmoor OS4 7RY, Examplia');
    expect(flow).toContain('certs@ravelin.example');
    expect(flow).toContain('+00 555 0142');
    expect(flow).toContain('Receiving dock 2');
    expect(flow).toContain('Brightwater BW9 1CL, Examplia');
    // The contact who receives certificates still follows the client's address.
    expect(flow).toContain('Maren Ostrowe, Quality manager');
  });

  it('issues revision 1 numbered C-YYYY-NNNN, stores the PDF with its SHA-256, and certifies the measurement', async () => {
    expect(first.number).toMatch(/^C-\d{4}-\d{4,}$/);
    expect(first.revision).toBe(1);
    expect(sha256Hex(firstPdf)).toBe(first.sha256);
    const [row] = await testApp.deps.db.select().from(certificates).where(eq(certificates.id, first.id));
    expect(row).toMatchObject({ status: 'current', byteSize: firstPdf.length, organisationId: bench.organisation.id, issuedById: admin.person.id });
    expect(row.objectKey).toBe(
      `orgs/${bench.organisation.id}/work-orders/${bench.workOrder.id}/measurements/${measurementId}/certificates/${first.number}-r1.pdf`,
    );
    expect(row.pageCount).toBe(pages.length);
    const [m] = await testApp.deps.db.select({ status: measurements.status }).from(measurements).where(eq(measurements.id, measurementId));
    expect(m.status).toBe('certified');
  });

  it('a second issue for the same measurement is refused with 409 naming the certified state', async () => {
    const again = await post(admin, `/api/measurements/${measurementId}/certificates`);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toContain('status certified');
  });
});

describe('the issued PDF, read back with pdftotext', () => {
  // The §7.8.2 items as methods.md §9 lists them, each found with the measurement's own value.
  it('names the certificate number and revision, and pages as "x of y" on every page', () => {
    expect(flow).toContain(first.number);
    expect(flow).toMatch(/[Rr]evision 1/);
    pages.forEach((page, i) => expect(flowText(page)).toContain(`${i + 1} of ${pages.length}`));
  });

  it('names the client with its contact and order reference, and the item with its identifier and part number', () => {
    expect(flow).toContain(bench.organisation.name);
    expect(flow).toContain('Maren Ostrowe');
    expect(flow).toContain(bench.workOrder.number);
    expect(flow).toContain(bench.lens.identifier);
    expect(flow).toContain(bench.lens.partNumber!);
  });

  it('names the method, the environment and each piece of equipment with its calibration reference and due date', () => {
    expect(flow).toContain('Finite conjugate');
    expect(flow).toContain('20.7');
    expect(flow).toContain('43');
    // Narrow table cells wrap long identifiers across layout columns; pdftotext -raw keeps each cell's text in drawing order.
    const unwrapped = runPoppler('pdftotext', ['-raw', '-enc', 'UTF-8', path.join(folder, 'api-certificate-r1.pdf'), '-']).replace(/\s/g, '');
    for (const item of [bench.equipment.camera, bench.equipment.target, bench.equipment.railScale]) {
      expect(unwrapped).toContain(item.identifier);
      expect(flow).toContain(item.calibrationReference);
      expect(flow).toContain(item.calibrationDueDate);
    }
  });

  it('states f ± U as the engine computed it (U to two significant digits, JCGM 100:2008 §7.2.6), with k and the coverage probability', () => {
    const { valueText, uncertaintyText } = formatMeasuredValue({ value: bench.result.focalLengthMm, uncertainty: bench.result.expandedUncertaintyMm });
    expect(flow).toContain(valueText);
    expect(flow).toContain(uncertaintyText);
    expect(flow).toMatch(/k = \d\.\d+/);
    expect(flow).toContain(`${formatPercent(bench.result.coverageProbability ?? 0.95)} %`);
    const power = formatMeasuredValue({ value: 1000 / bench.result.focalLengthMm, uncertainty: (1000 * bench.result.expandedUncertaintyMm) / bench.result.focalLengthMm ** 2 });
    expect(flow).toContain(power.valueText);
  });

  it('states the work order’s decision rule (guarded) and the conformity decision the approved analysis result holds', () => {
    expect(flow).toContain('Guarded acceptance');
    const analysed = bench.result.conformity;
    expect(analysed?.rule).toBe('guarded');
    expect(flow).toContain(`${decisionWords[analysed!.decision]}. `);
    for (const other of Object.values(decisionWords).filter((word) => word !== decisionWords[analysed!.decision])) {
      expect(flow).not.toContain(`${other}. `);
    }
  });

  it('names who performed and who authorised it, the responsibility and safety footer, and the verification code', () => {
    expect(flow).toContain(technician.person.name);
    expect(flow).toContain(reviewer.person.name);
    expect(flow).toContain('remain the laboratory’s responsibility');
    expect(flow).toContain('Never look into a collimated beam');
    expect(flow).toContain('The results relate only to the item measured');
    expect(flow).toContain(first.verificationCode);
  });
});

describe('reissue and download', () => {
  let second: typeof first & { status: string; reissueReason: string };

  beforeAll(async () => {
    const answer = await post(reviewer, `/api/certificates/${first.id}/reissue`, { reason: 'The client’s order reference was corrected.' });
    expect(answer.status, JSON.stringify(answer.body)).toBe(201);
    second = answer.body.certificate;
  }, 60_000);

  it('makes revision 2 current with the same number, marks revision 1 superseded, and keeps both downloadable with their stored hashes', async () => {
    expect(second).toMatchObject({ number: first.number, revision: 2, status: 'current', reissueReason: 'The client’s order reference was corrected.' });
    const list = await technician.agent.get(`/api/measurements/${measurementId}/certificates`);
    expect(list.status).toBe(200);
    expect(list.body.certificates.map((c: { revision: number; status: string }) => [c.revision, c.status])).toEqual([
      [2, 'current'],
      [1, 'superseded'],
    ]);
    expect(list.body.certificates[1].supersededByCertificateId).toBe(second.id);
    for (const certificate of list.body.certificates) {
      const got = await download(reviewer, certificate.id);
      expect(got.status).toBe(200);
      expect(sha256Hex(got.body as Buffer)).toBe(certificate.sha256);
    }
    const text = flowText(readPdf('api-certificate-r2', (await download(reviewer, second.id)).body as Buffer).join('\n'));
    expect(text).toContain('replaces revision 1');
    expect(text).toContain('The client’s order reference was corrected.');
    const [measurement] = await testApp.deps.db.select({ status: measurements.status }).from(measurements).where(eq(measurements.id, measurementId));
    expect(measurement.status).toBe('certified');
    const events = await testApp.deps.db.select().from(auditEvents).where(eq(auditEvents.subjectId, second.id));
    expect(events.map((e) => [e.action, e.actorId])).toEqual([['certificate.reissued', reviewer.person.id]]);
  });

  it('refuses to reissue a superseded revision (409) or without a reason (400)', async () => {
    const stale = await post(reviewer, `/api/certificates/${first.id}/reissue`, { reason: 'Another correction.' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.message).toContain('superseded by revision 2');
    const noReason = await post(reviewer, `/api/certificates/${second.id}/reissue`, { reason: '' });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields.reason).toContain('why');
  });

  it('lets the client of the certificate’s organisation download it, and answers 404 to a client of another organisation', async () => {
    expect((await download(ownClient, second.id)).status).toBe(200);
    const refused = await otherClient.agent.get(`/api/certificates/${second.id}/pdf`);
    expect(refused.status).toBe(404);
    expect(refused.body.error.message).toBe(`There is no certificate with id ${second.id}.`);
    expect((await otherClient.agent.get(`/api/measurements/${measurementId}/certificates`)).status).toBe(403);
  });

  it('GET /api/measurements/:id reports the review people and the certificates', async () => {
    const detail = await reviewer.agent.get(`/api/measurements/${measurementId}`);
    expect(detail.body.measurement.review).toMatchObject({ submittedBy: { id: technician.person.id }, approvedBy: { id: reviewer.person.id } });
    expect(detail.body.measurement.certificates.map((c: { revision: number }) => c.revision)).toEqual([2, 1]);
    expect(detail.body.measurement.number).toBe(measurementNumber);
  });
});

describe('the certificate states what was approved', () => {
  it('keeps the analysed decision rule and decision when the work order’s rule changed after approval', async () => {
    const { workOrder } = await createTestWorkOrder(testApp.deps);
    const lens = await createTestLens(testApp.deps, workOrder.id, { nominalFocalLengthMm: bench.lens.nominalFocalLengthMm, tolerancePercent: bench.lens.tolerancePercent });
    const staged = await stageMeasurement(testApp, { ...bench, lens }, { performedById: technician.person.id, status: 'analysed' });
    expect((await post(technician, `/api/measurements/${staged.id}/submission`)).status).toBe(200);
    expect((await post(reviewer, `/api/measurements/${staged.id}/approval`)).status).toBe(200);
    await testApp.deps.db.update(workOrders).set({ decisionRule: 'simple' }).where(eq(workOrders.id, workOrder.id));
    const issued = await post(admin, `/api/measurements/${staged.id}/certificates`);
    expect(issued.status, JSON.stringify(issued.body)).toBe(201);
    const text = flowText(readPdf('api-certificate-rule-changed', (await download(admin, issued.body.certificate.id)).body as Buffer).join('\n'));
    expect(text).toContain(decisionRuleNames.guarded);
    expect(text).not.toContain(decisionRuleNames.simple);
    expect(text).toContain(`${decisionWords[bench.result.conformity!.decision]}. `);
  }, 60_000);
});

describe('a failed issue leaves nothing behind', () => {
  it('when the data cannot make a certificate (equipment past its due date with no override), 409 names the field and no row or PDF is stored', async () => {
    const staged = await stageMeasurement(testApp, bench, { performedById: technician.person.id, status: 'approved', submittedById: technician.person.id, approvedById: reviewer.person.id });
    await testApp.deps.db.update(measurements).set({ measuredOn: '2099-01-01' }).where(eq(measurements.id, staged.id));
    const prefix = `orgs/${bench.organisation.id}/work-orders/${bench.workOrder.id}/measurements/${staged.id}/`;
    const refused = await post(admin, `/api/measurements/${staged.id}/certificates`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/^The certificate cannot be drawn: /);
    expect(await testApp.deps.db.select().from(certificates).where(eq(certificates.measurementId, staged.id))).toHaveLength(0);
    expect(await testApp.deps.storage.listObjects(prefix)).toHaveLength(0);
  });
});
