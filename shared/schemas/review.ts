/**
 * The review of a measurement as the API takes and returns it: submission,
 * approval, return with a comment, the comment thread and the reviewer's
 * queue. The four-eyes sentence lives here so the page and the server say
 * the same thing. No Node APIs here.
 */
import { z } from 'zod';
import type { PersonReference } from './analyses';
import type { MeasurementMethodName, MeasurementStatus } from './measurements';

export const reviewEntryKinds = ['comment', 'submission', 'return', 'approval'] as const;
export type ReviewEntryKind = (typeof reviewEntryKinds)[number];

export const REVIEW_REMARK_MAX_LENGTH = 2000;

const remark = (field: string) =>
  z
    .string({ error: `Field "${field}" must be text.` })
    .trim()
    .max(REVIEW_REMARK_MAX_LENGTH, { error: `Field "${field}" must be at most ${REVIEW_REMARK_MAX_LENGTH} characters long.` });

/** Submission and approval may carry a remark for the thread. */
export const transitionRemarkBody = z.strictObject({
  remark: remark('remark')
    .optional()
    .transform((value) => (value ? value : undefined)),
});
export type TransitionRemarkInput = z.infer<typeof transitionRemarkBody>;

/** A return always says why: the technician must know what to change. */
export const returnMeasurementBody = z.strictObject({
  comment: remark('comment').min(1, { error: 'Field "comment" must say what the technician should change; a measurement is never returned without a reason.' }),
});
export type ReturnMeasurementInput = z.infer<typeof returnMeasurementBody>;

export const reviewCommentBody = z.strictObject({
  body: remark('body').min(1, { error: 'Field "body" must not be empty.' }),
});
export type ReviewCommentInput = z.infer<typeof reviewCommentBody>;

export interface ReviewEntry {
  id: string;
  kind: ReviewEntryKind;
  body: string;
  author: (PersonReference & { roles: string[] }) | null;
  /** The analysis version the remark was made about, when known. */
  analysisVersion: number | null;
  /** ISO 8601 instant. */
  createdAt: string;
}

export interface ReviewEntriesResponse {
  entries: ReviewEntry[];
}

export interface ReviewEntryResponse {
  entry: ReviewEntry;
}

/** Where a measurement stands in review, as GET /api/measurements/:id reports it. */
export interface MeasurementReviewState {
  submittedAt: string | null;
  submittedBy: PersonReference | null;
  approvedAt: string | null;
  approvedBy: PersonReference | null;
}

export interface ReviewQueueItem {
  measurementId: string;
  number: string;
  method: MeasurementMethodName;
  status: MeasurementStatus;
  workOrder: { id: string; number: string };
  lens: { id: string; identifier: string };
  client: { id: string; name: string };
  performedBy: PersonReference | null;
  submittedBy: PersonReference | null;
  /** ISO 8601 instants. */
  submittedAt: string | null;
  approvedAt: string | null;
  approvedBy: PersonReference | null;
  focalLengthMm: number | null;
  expandedUncertaintyMm: number | null;
  coverageFactor: number | null;
  /** Seconds since submission (the submitted list) or approval (the awaiting-certificate list), by the server's clock. */
  waitingSeconds: number;
}

export interface ReviewQueueResponse {
  /** Oldest submission first. */
  submitted: ReviewQueueItem[];
  /** Approved, certificate not yet issued; oldest approval first. */
  awaitingCertificate: ReviewQueueItem[];
}

/**
 * The four-eyes rule: nobody approves or certifies a measurement they
 * performed or submitted. Returns the sentence that refuses `personId`, or
 * null when they may act.
 */
export function fourEyesRefusal(
  measurement: { number: string; performedById: string | null; submittedById: string | null },
  personId: string,
  action: 'approve' | 'issue a certificate for' | 'reissue a certificate for',
): string | null {
  if (measurement.performedById === personId) {
    return `You performed measurement ${measurement.number}, so you cannot ${action} it: another reviewer must (four-eyes rule).`;
  }
  if (measurement.submittedById === personId) {
    return `You submitted measurement ${measurement.number}, so you cannot ${action} it: another reviewer must (four-eyes rule).`;
  }
  return null;
}
