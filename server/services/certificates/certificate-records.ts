import { asc, desc, eq } from 'drizzle-orm';
import { certificateDownloadPath, type CertificateSummary } from '../../../shared/schemas/certificates';
import type { Database } from '../../db/client';
import { certificates, measurements, people } from '../../db/schema';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { visibleOrganisationOf, type Viewer } from '../catalogue-queries';
import type { Queryable } from '../numbering';

type CertificateRow = typeof certificates.$inferSelect;

export function toCertificateSummary(row: CertificateRow, issuedByName: string | null): CertificateSummary {
  return {
    id: row.id,
    number: row.number,
    revision: row.revision,
    status: row.status,
    measurementId: row.measurementId,
    verificationCode: row.verificationCode,
    sha256: row.sha256,
    byteSize: row.byteSize,
    pageCount: row.pageCount,
    reissueReason: row.reissueReason,
    issuedBy: row.issuedById && issuedByName ? { id: row.issuedById, name: issuedByName } : null,
    issuedAt: row.issuedAt.toISOString(),
    supersededAt: row.supersededAt?.toISOString() ?? null,
    supersededByCertificateId: row.supersededByCertificateId,
    downloadPath: certificateDownloadPath(row.id),
  };
}

/** Every revision of a measurement's certificates, newest revision first. */
export async function listMeasurementCertificates(db: Queryable, measurementId: string): Promise<CertificateSummary[]> {
  const rows = await db
    .select({ certificate: certificates, issuedByName: people.name })
    .from(certificates)
    .leftJoin(people, eq(people.id, certificates.issuedById))
    .where(eq(certificates.measurementId, measurementId))
    .orderBy(asc(certificates.number), desc(certificates.revision));
  return rows.map((r) => toCertificateSummary(r.certificate, r.issuedByName));
}

export async function requireMeasurementExists(db: Database, measurementId: string): Promise<void> {
  const [row] = await db.select({ id: measurements.id }).from(measurements).where(eq(measurements.id, measurementId));
  if (!row) throw new HttpError(HttpStatus.NOT_FOUND, `There is no measurement with id ${measurementId}.`);
}

export async function getCertificateSummary(db: Database, certificateId: string): Promise<CertificateSummary> {
  const [row] = await db
    .select({ certificate: certificates, issuedByName: people.name })
    .from(certificates)
    .leftJoin(people, eq(people.id, certificates.issuedById))
    .where(eq(certificates.id, certificateId));
  if (!row) throw new HttpError(HttpStatus.NOT_FOUND, `There is no certificate with id ${certificateId}.`);
  return toCertificateSummary(row.certificate, row.issuedByName);
}

/**
 * The certificate row a viewer may download: staff any, a client only its
 * own organisation's. Anything else is "not found", so a client cannot learn
 * that another organisation's certificate exists.
 */
export async function findDownloadableCertificate(db: Database, certificateId: string, viewer: Viewer): Promise<CertificateRow> {
  const [row] = await db.select().from(certificates).where(eq(certificates.id, certificateId));
  const visible = visibleOrganisationOf(viewer);
  if (!row || (visible !== null && row.organisationId !== visible)) {
    throw new HttpError(HttpStatus.NOT_FOUND, `There is no certificate with id ${certificateId}.`);
  }
  return row;
}
