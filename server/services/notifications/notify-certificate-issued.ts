import type { Queryable } from '../numbering';

export interface CertificateIssuedNotice {
  certificateId: string;
  /** PUBLIC_BASE_URL, for links in the message. */
  baseUrl: string;
}

/** Queues "certificate issued" to the client organisation's contacts (inside the issuing transaction). */
export async function notifyCertificateIssued(_db: Queryable, _notice: CertificateIssuedNotice): Promise<void> {
  // Filled in by the outbound-mail work (templates and recipients).
}
