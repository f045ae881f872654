/**
 * Issuing a certificate (approved → certified) and reissuing one (a new
 * revision of the same number; the previous one is superseded, nothing is
 * deleted). The PDF is rendered and stored inside the transaction that
 * records it; if that transaction fails, the stored object is removed so no
 * orphan PDF is left behind.
 */
import { and, desc, eq } from 'drizzle-orm';
import { fourEyesRefusal } from '../../../shared/schemas/review';
import { certificateFileName } from '../../../shared/schemas/certificates';
import { CertificateDataError, parseCertificateData } from '../../certificates/certificate-data';
import { renderCertificatePdf } from '../../certificates/render-certificate-pdf';
import { makeVerificationCode, sha256Hex } from '../../certificates/verification-code';
import type { AppDeps } from '../../deps';
import { certificates, lenses, measurements, workOrders } from '../../db/schema';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { recordAuditEvent } from '../audit-log';
import type { Actor } from '../catalogue-queries';
import { notifyCertificateIssued } from '../notifications/notify-certificate-issued';
import { allocateNumber, type Queryable } from '../numbering';
import { lockMeasurementForReview, requireStatus, type MeasurementRow } from '../review/measurement-under-review';
import { buildCertificateData } from './build-certificate-data';

export type IssueCertificateDeps = Pick<AppDeps, 'db' | 'storage' | 'log'> & { env: Pick<AppDeps['env'], 'PUBLIC_BASE_URL'> };

/** Poppler and pdfkit both write one `/Type /Page` object per page; counted on the bytes we just made. */
function countPdfPages(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/Type\s*\/Page(?![s\w])/g) ?? []).length;
}

async function objectKeyFor(tx: Queryable, measurement: MeasurementRow, number: string, revision: number): Promise<{ key: string; organisationId: string }> {
  const [location] = await tx
    .select({ organisationId: workOrders.organisationId, workOrderId: workOrders.id })
    .from(lenses)
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .where(eq(lenses.id, measurement.lensId));
  return {
    organisationId: location.organisationId,
    key: `orgs/${location.organisationId}/work-orders/${location.workOrderId}/measurements/${measurement.id}/certificates/${certificateFileName(number, revision)}`,
  };
}

function todayUtc(now: Date): string {
  return now.toISOString().slice(0, 10);
}

async function renderChecked(data: unknown): Promise<{ pdf: Buffer; data: ReturnType<typeof parseCertificateData> }> {
  try {
    const checked = parseCertificateData(data);
    return { pdf: await renderCertificatePdf(checked), data: checked };
  } catch (error) {
    if (error instanceof CertificateDataError) throw new HttpError(HttpStatus.CONFLICT, error.message, error.fields);
    throw error;
  }
}

interface Stored {
  key: string | null;
}

/** Runs `work` in a transaction; when it fails after storing a PDF, the PDF goes too. */
async function withStoredPdfCleanup<T>(deps: IssueCertificateDeps, work: (tx: Queryable, stored: Stored) => Promise<T>): Promise<T> {
  const stored: Stored = { key: null };
  try {
    return await deps.db.transaction((tx) => work(tx, stored));
  } catch (error) {
    if (stored.key) {
      await deps.storage.deleteObject(stored.key).catch((cleanupError: unknown) =>
        deps.log.error('A certificate PDF could not be removed after its transaction failed.', { key: stored.key, error: cleanupError }),
      );
    }
    throw error;
  }
}

async function storeAndRecord(
  deps: IssueCertificateDeps,
  tx: Queryable,
  stored: Stored,
  options: { measurement: MeasurementRow; number: string; revision: number; data: unknown; reissueReason: string | null; actor: Actor },
) {
  const { measurement, number, revision, actor } = options;
  const { pdf, data } = await renderChecked(options.data);
  const { key, organisationId } = await objectKeyFor(tx, measurement, number, revision);
  await deps.storage.putObject(key, pdf, { contentType: 'application/pdf' });
  stored.key = key;
  const [created] = await tx
    .insert(certificates)
    .values({
      number,
      revision,
      measurementId: measurement.id,
      organisationId,
      status: 'current',
      verificationCode: data.verification.code,
      objectKey: key,
      sha256: sha256Hex(pdf),
      byteSize: pdf.length,
      pageCount: countPdfPages(pdf),
      data: data as unknown as Record<string, unknown>,
      reissueReason: options.reissueReason,
      issuedById: actor.actorId,
    })
    .returning();
  return created;
}

/** approved → certified: the first revision of a new certificate number, by a reviewer or admin other than the performer or submitter. */
export async function issueCertificate(deps: IssueCertificateDeps, measurementId: string, actor: Actor, now = new Date()): Promise<string> {
  return withStoredPdfCleanup(deps, async (tx, stored) => {
    const measurement = await lockMeasurementForReview(tx, measurementId);
    requireStatus(measurement, ['approved'], 'have a certificate issued');
    const refusal = fourEyesRefusal(measurement, actor.actorId, 'issue a certificate for');
    if (refusal) throw new HttpError(HttpStatus.FORBIDDEN, refusal);

    const issueDate = todayUtc(now);
    const number = await allocateNumber(tx, 'certificate', Number(issueDate.slice(0, 4)));
    const data = await buildCertificateData(tx, measurement.id, {
      number,
      revision: 1,
      issueDate,
      verificationCode: makeVerificationCode(),
      publicBaseUrl: deps.env.PUBLIC_BASE_URL,
    });
    const created = await storeAndRecord(deps, tx, stored, { measurement, number, revision: 1, data, reissueReason: null, actor });
    await tx.update(measurements).set({ status: 'certified', updatedAt: now }).where(eq(measurements.id, measurement.id));
    await recordAuditEvent(tx, {
      actorId: actor.actorId,
      action: 'certificate.issued',
      subjectType: 'certificate',
      subjectId: created.id,
      details: { number, revision: 1, measurementId: measurement.id, measurementNumber: measurement.number, sha256: created.sha256 },
      ip: actor.ip ?? null,
    });
    await recordAuditEvent(tx, {
      actorId: actor.actorId,
      action: 'measurement.certified',
      subjectType: 'measurement',
      subjectId: measurement.id,
      details: { number: measurement.number, certificateId: created.id, certificateNumber: number },
      ip: actor.ip ?? null,
    });
    await notifyCertificateIssued(tx, { certificateId: created.id, baseUrl: deps.env.PUBLIC_BASE_URL });
    return created.id;
  });
}

/**
 * A new revision of a current certificate, with the reason printed on it;
 * the data is read afresh (so a corrected record shows), the previous
 * revision is marked superseded and kept.
 */
export async function reissueCertificate(deps: IssueCertificateDeps, certificateId: string, reason: string, actor: Actor, now = new Date()): Promise<string> {
  return withStoredPdfCleanup(deps, async (tx, stored) => {
    const [previous] = await tx.select().from(certificates).where(eq(certificates.id, certificateId));
    if (!previous) throw new HttpError(HttpStatus.NOT_FOUND, `There is no certificate with id ${certificateId}.`);
    const measurement = await lockMeasurementForReview(tx, previous.measurementId);
    const [latest] = await tx
      .select()
      .from(certificates)
      .where(and(eq(certificates.number, previous.number)))
      .orderBy(desc(certificates.revision))
      .limit(1)
      .for('update');
    if (latest.id !== previous.id || previous.status !== 'current') {
      throw new HttpError(
        HttpStatus.CONFLICT,
        `Certificate ${previous.number} revision ${previous.revision} is superseded by revision ${latest.revision}; reissue the current revision instead.`,
      );
    }
    requireStatus(measurement, ['certified'], 'have its certificate reissued');
    const refusal = fourEyesRefusal(measurement, actor.actorId, 'reissue a certificate for');
    if (refusal) throw new HttpError(HttpStatus.FORBIDDEN, refusal);

    const revision = previous.revision + 1;
    const data = await buildCertificateData(tx, measurement.id, {
      number: previous.number,
      revision,
      issueDate: todayUtc(now),
      replaces: { revision: previous.revision, reason },
      verificationCode: makeVerificationCode(),
      publicBaseUrl: deps.env.PUBLIC_BASE_URL,
    });
    const created = await storeAndRecord(deps, tx, stored, { measurement, number: previous.number, revision, data, reissueReason: reason, actor });
    await tx
      .update(certificates)
      .set({ status: 'superseded', supersededAt: now, supersededByCertificateId: created.id })
      .where(eq(certificates.id, previous.id));
    await recordAuditEvent(tx, {
      actorId: actor.actorId,
      action: 'certificate.reissued',
      subjectType: 'certificate',
      subjectId: created.id,
      details: { number: previous.number, revision, replacesCertificateId: previous.id, replacesRevision: previous.revision, reason, sha256: created.sha256 },
      ip: actor.ip ?? null,
    });
    await notifyCertificateIssued(tx, { certificateId: created.id, baseUrl: deps.env.PUBLIC_BASE_URL });
    return created.id;
  });
}
