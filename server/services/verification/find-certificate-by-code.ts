import { and, eq, max } from 'drizzle-orm';
import type { CertificateData } from '../../certificates/certificate-data';
import { normaliseVerificationCode } from '../../certificates/verification-code';
import { certificates } from '../../db/schema';
import type { Queryable } from '../numbering';
import type { VerifiedCertificate } from '../../../shared/schemas/verification';

export interface CertificateByCode {
  view: VerifiedCertificate;
  sha256: string;
}

/** The certificate revision a typed code belongs to, or null (a malformed code is simply unknown). */
export async function findCertificateByCode(db: Queryable, typedCode: string): Promise<CertificateByCode | null> {
  const code = normaliseVerificationCode(typedCode);
  if (code === null) return null;
  const [row] = await db.select().from(certificates).where(eq(certificates.verificationCode, code));
  if (!row) return null;
  const [current] = await db
    .select({ revision: max(certificates.revision) })
    .from(certificates)
    .where(and(eq(certificates.number, row.number), eq(certificates.status, 'current')));
  const data = row.data as unknown as CertificateData;
  const view: VerifiedCertificate = {
    found: true,
    genuine: true,
    number: row.number,
    revision: row.revision,
    status: row.status,
    currentRevision: current?.revision ?? row.revision,
    issueDate: data.certificate.issueDate,
    supersededOn: row.supersededAt ? row.supersededAt.toISOString().slice(0, 10) : null,
    labName: data.lab.name,
    item: { identifier: data.item.identifier, description: data.item.description },
    method: data.measurement.method,
    results: {
      focalLengthMm: data.results.focalLengthMm,
      expandedUncertaintyMm: data.results.expandedUncertaintyMm,
      coverageFactor: data.results.coverageFactor,
      decision: data.conformity.decision,
    },
  };
  return { view, sha256: row.sha256 };
}
