/**
 * A client's lens with a certified measurement and real certificate PDFs in
 * object storage, inserted directly (as the issuing code would leave them),
 * so the portal, verification and mail tests do not depend on the review
 * workflow. Every name and number is made unique per call.
 */
import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { CertificateData } from '../../../server/certificates/certificate-data';
import { renderCertificatePdf } from '../../../server/certificates/render-certificate-pdf';
import { makeVerificationCode, sha256Hex } from '../../../server/certificates/verification-code';
import { certificates, lenses, measurements, workOrders, type MeasurementStatus } from '../../../server/db/schema';
import type { AppDeps } from '../../../server/deps';
import { makeCertificateData } from '../../certificates/certificate-fixture';
import { uniqueSuffix } from '../../helpers/people';

export interface IssuedRevision {
  id: string;
  number: string;
  revision: number;
  verificationCode: string;
  pdf: Buffer;
  sha256: string;
  data: CertificateData;
}

export interface CertifiedLens {
  workOrderId: string;
  workOrderNumber: string;
  lensId: string;
  lensIdentifier: string;
  measurementId: string;
  measurementNumber: string;
  /** Oldest first; the last one is current. */
  revisions: IssuedRevision[];
}

export interface CertifiedLensOptions {
  organisationId: string;
  organisationName: string;
  /** How many revisions to issue (default 1); each later one supersedes the one before. */
  revisionCount?: number;
  performedById?: string | null;
  /** Status of the measurement (default 'certified'). */
  measurementStatus?: MeasurementStatus;
  /** Adds the lens to this work order instead of a new one. */
  workOrderId?: string;
}

function revisionData(base: CertificateData, options: { number: string; revision: number; code: string; clientName: string; lensIdentifier: string }): CertificateData {
  const issueDate = `2026-03-${String(11 + options.revision).padStart(2, '0')}`;
  return {
    ...base,
    certificate: {
      number: options.number,
      revision: options.revision,
      issueDate,
      ...(options.revision > 1 ? { replaces: { revision: options.revision - 1, reason: 'The order reference was printed wrongly.' } } : {}),
    },
    client: { ...base.client, name: options.clientName },
    item: { ...base.item, identifier: options.lensIdentifier },
    people: { ...base.people, authorisedBy: { ...base.people.authorisedBy, date: issueDate } },
    verification: { code: options.code, publicBaseUrl: 'http://127.0.0.1:8080' },
  };
}

export async function insertCertifiedLens(deps: Pick<AppDeps, 'db' | 'storage'>, options: CertifiedLensOptions): Promise<CertifiedLens> {
  const suffix = uniqueSuffix().toUpperCase();
  const lensIdentifier = `L-${suffix}`;
  let workOrderId = options.workOrderId;
  let workOrderNumber: string;
  if (workOrderId) {
    const [order] = await deps.db.select({ number: workOrders.number }).from(workOrders).where(eq(workOrders.id, workOrderId));
    workOrderNumber = order.number;
  } else {
    workOrderNumber = `WO-T-${suffix}`;
    const [order] = await deps.db
      .insert(workOrders)
      .values({ number: workOrderNumber, organisationId: options.organisationId, title: `Incoming inspection ${suffix}`, status: 'in-progress', clientReference: `PO-${suffix}` })
      .returning({ id: workOrders.id });
    workOrderId = order.id;
  }
  const [lens] = await deps.db
    .insert(lenses)
    .values({ workOrderId, identifier: lensIdentifier, description: 'Plano-convex singlet, 25.4 mm', nominalFocalLengthMm: 100, tolerancePercent: 1 })
    .returning({ id: lenses.id });
  const measurementNumber = `M-T-${suffix}`;
  const [measurement] = await deps.db
    .insert(measurements)
    .values({ number: measurementNumber, lensId: lens.id, method: 'finite-conjugate', status: options.measurementStatus ?? 'certified', performedById: options.performedById ?? null })
    .returning({ id: measurements.id });

  const number = `C-T-${suffix}`;
  const revisions: IssuedRevision[] = [];
  const base = makeCertificateData();
  for (let revision = 1; revision <= (options.revisionCount ?? 1); revision += 1) {
    const verificationCode = makeVerificationCode();
    const data = revisionData(base, { number, revision, code: verificationCode, clientName: options.organisationName, lensIdentifier });
    const pdf = await renderCertificatePdf(data);
    const objectKey = `certificates/test/${randomUUID()}.pdf`;
    await deps.storage.putObject(objectKey, pdf, { contentType: 'application/pdf' });
    const previous = revisions.at(-1);
    const [row] = await deps.db
      .insert(certificates)
      .values({
        number,
        revision,
        measurementId: measurement.id,
        organisationId: options.organisationId,
        status: 'current',
        verificationCode,
        objectKey,
        sha256: sha256Hex(pdf),
        byteSize: pdf.length,
        pageCount: 2,
        data: data as unknown as Record<string, unknown>,
        reissueReason: revision > 1 ? 'The order reference was printed wrongly.' : null,
      })
      .returning({ id: certificates.id });
    if (previous) {
      await deps.db
        .update(certificates)
        .set({ status: 'superseded', supersededAt: new Date(), supersededByCertificateId: row.id })
        .where(eq(certificates.id, previous.id));
    }
    revisions.push({ id: row.id, number, revision, verificationCode, pdf, sha256: sha256Hex(pdf), data });
  }
  return { workOrderId, workOrderNumber, lensId: lens.id, lensIdentifier, measurementId: measurement.id, measurementNumber, revisions };
}
