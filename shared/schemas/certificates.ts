/**
 * Certificates as the API takes and returns them: issue, reissue with a
 * reason, every revision of a measurement's certificate. No Node APIs here.
 */
import { z } from 'zod';
import type { PersonReference } from './analyses';

export const certificateStatuses = ['current', 'superseded'] as const;
export type CertificateStatusName = (typeof certificateStatuses)[number];

export const REISSUE_REASON_MAX_LENGTH = 500;

export const issueCertificateBody = z.strictObject({});

export const reissueCertificateBody = z.strictObject({
  reason: z
    .string({ error: 'Field "reason" must be text.' })
    .trim()
    .min(5, { error: 'Field "reason" must say why the certificate is reissued (at least 5 characters); it is printed on the new revision.' })
    .max(REISSUE_REASON_MAX_LENGTH, { error: `Field "reason" must be at most ${REISSUE_REASON_MAX_LENGTH} characters long.` }),
});
export type ReissueCertificateInput = z.infer<typeof reissueCertificateBody>;

export interface CertificateSummary {
  id: string;
  number: string;
  revision: number;
  status: CertificateStatusName;
  measurementId: string;
  verificationCode: string;
  sha256: string;
  byteSize: number;
  pageCount: number;
  reissueReason: string | null;
  issuedBy: PersonReference | null;
  /** ISO 8601 instants. */
  issuedAt: string;
  supersededAt: string | null;
  supersededByCertificateId: string | null;
  /** Where the PDF is downloaded. */
  downloadPath: string;
}

export interface CertificatesResponse {
  certificates: CertificateSummary[];
}

export interface CertificateResponse {
  certificate: CertificateSummary;
}

export function certificateDownloadPath(certificateId: string): string {
  return `/api/certificates/${certificateId}/pdf`;
}

export function certificateFileName(number: string, revision: number): string {
  return `${number}-r${revision}.pdf`;
}

export const certificateIdParams = z.object({
  certificateId: z.uuid({ error: 'Field "certificateId" must be an id (a UUID).' }),
});
