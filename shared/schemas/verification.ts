/** The public verification answers (GET /api/verification/:code and POST …/document); shared by server and client. */
import type { ConformityDecision } from './lenses';
import type { MeasurementMethod } from '../measure/types';

/**
 * What the public verification page may learn about a certificate: enough to
 * compare with the paper in hand, nothing about the client's people or the
 * lab's internal records.
 */
export interface VerifiedCertificate {
  found: true;
  genuine: true;
  number: string;
  revision: number;
  status: 'current' | 'superseded';
  /** The revision of this certificate number that is current today. */
  currentRevision: number;
  /** YYYY-MM-DD, as printed. */
  issueDate: string;
  /** YYYY-MM-DD when a later revision replaced this one; null while current. */
  supersededOn: string | null;
  labName: string;
  item: { identifier: string; description: string };
  method: MeasurementMethod;
  results: {
    focalLengthMm: number;
    expandedUncertaintyMm: number;
    coverageFactor: number;
    decision: ConformityDecision;
  };
}

export interface DocumentCheck {
  found: true;
  /** True when the uploaded file's SHA-256 equals the one kept when this revision was issued. */
  matches: boolean;
  number: string;
  revision: number;
  status: 'current' | 'superseded';
  currentRevision: number;
  /** SHA-256 of the uploaded file (lower-case hex), for the visitor's own records. */
  uploadedSha256: string;
}
