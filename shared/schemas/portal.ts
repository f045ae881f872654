/**
 * The client portal's contracts: a client organisation's orders with coarse
 * progress, results from issued certificates, and the request for new work.
 * Shared by the server's validators and the client; no Node APIs here.
 */
import { z } from 'zod';
import type { MeasurementMethod } from '../measure/types';
import { createLensBody, type ConformityDecision, type CreateLensInput } from './lenses';
import {
  decisionRules,
  isoDateField,
  optionalText,
  pageField,
  pageSizeField,
  searchTextField,
  trimmedText,
  workOrderStatuses,
  type DecisionRule,
  type WorkOrderStatus,
} from './work-orders';

export const WORK_REQUEST_MAX_LENSES = 50;
export const PORTAL_PAGE_SIZE_DEFAULT = 20;
export const PORTAL_PAGE_SIZE_MAX = 50;

/* --------------------------------- orders --------------------------------- */

/** `q` searches number, title, client reference and lens identifiers; `status` takes one or more statuses, comma-separated. */
export const portalOrdersQuery = z.strictObject({
  q: searchTextField(),
  status: z
    .string({ error: 'Field "status" must be text.' })
    .transform((value, context) => {
      const statuses = value.split(',').map((part) => part.trim()).filter(Boolean);
      if (statuses.length === 0 || statuses.some((status) => !(workOrderStatuses as readonly string[]).includes(status))) {
        context.addIssue({ code: 'custom', message: `Field "status" must be one or more of: ${workOrderStatuses.join(', ')} (comma-separated).` });
        return z.NEVER;
      }
      return statuses as WorkOrderStatus[];
    })
    .optional(),
  page: pageField(),
  pageSize: pageSizeField(PORTAL_PAGE_SIZE_MAX, PORTAL_PAGE_SIZE_DEFAULT),
});
export type PortalOrdersQuery = z.output<typeof portalOrdersQuery>;

/**
 * Where a measurement stands, as a client is told: the bench steps (draft,
 * analysis, a return for changes) are all "being measured"; submitted and
 * approved are "in review"; "certified" once a certificate is current.
 */
export const clientMeasurementStages = ['being-measured', 'in-review', 'certified'] as const;
export type ClientMeasurementStage = (typeof clientMeasurementStages)[number];

export interface PortalCertificateRevision {
  id: string;
  number: string;
  revision: number;
  status: 'current' | 'superseded';
  /** ISO 8601 timestamp. */
  issuedAt: string;
  downloadUrl: string;
}

/** Taken from the current certificate's data, never from an unreviewed analysis. */
export interface PortalResultSummary {
  focalLengthMm: number;
  expandedUncertaintyMm: number;
  coverageFactor: number;
  decision: ConformityDecision;
}

export interface PortalMeasurement {
  number: string;
  method: MeasurementMethod;
  stage: ClientMeasurementStage;
  /** Present only when certified. */
  result: PortalResultSummary | null;
  /** Every revision, newest first. */
  certificates: PortalCertificateRevision[];
}

export interface PortalLens {
  id: string;
  identifier: string;
  description: string;
  partNumber: string | null;
  nominalFocalLengthMm: number;
  tolerancePercent: number | null;
  toleranceMm: number | null;
  /** Oldest first. */
  measurements: PortalMeasurement[];
}

export interface PortalWorkOrder {
  id: string;
  number: string;
  title: string;
  clientReference: string | null;
  status: WorkOrderStatus;
  /** YYYY-MM-DD or null. */
  dueDate: string | null;
  /** ISO 8601 timestamp. */
  createdAt: string;
  lenses: PortalLens[];
}

export interface PortalOrdersResponse {
  /** Null for a client account that belongs to no organisation (it sees nothing). */
  organisation: { id: string; name: string } | null;
  items: PortalWorkOrder[];
  total: number;
  page: number;
  pageSize: number;
}

/* ------------------------------ work requests ------------------------------ */

/** `lenses[2].nominalFocalLengthMm`: how a field of one lens is named in messages and `fields`. */
export function lensFieldName(index: number, field: string): string {
  return `lenses[${index}].${field}`;
}

/** A lens's own message said about lens `index` of the request. */
function messageForLens(index: number, message: string): string {
  const named = message.replace(/Field "([A-Za-z]+)"/g, (_, field: string) => `Field "${lensFieldName(index, field)}"`);
  return named === message ? `Lens ${index + 1} (lenses[${index}]): ${message}` : named;
}

/** Each lens is checked by the same rules as a lens the lab adds (createLensBody). */
const requestedLenses = z
  .array(z.unknown(), { error: 'Field "lenses" must be a list of lenses.' })
  .min(1, { error: 'Field "lenses" must list at least one lens to measure.' })
  .max(WORK_REQUEST_MAX_LENSES, { error: `Field "lenses" must list at most ${WORK_REQUEST_MAX_LENSES} lenses; send a larger batch as several requests.` })
  .transform((items, context) => {
    const parsed: CreateLensInput[] = [];
    items.forEach((item, index) => {
      const result = createLensBody.safeParse(item, {
        error: (issue) =>
          issue.code === 'unrecognized_keys'
            ? `Lens ${index + 1} has unexpected field(s): ${issue.keys.join(', ')}.`
            : issue.code === 'invalid_type' && issue.path?.length === 0
              ? `Field "lenses[${index}]" must be a lens (an object).`
              : undefined,
      });
      if (result.success) {
        parsed.push(result.data);
        return;
      }
      for (const issue of result.error.issues) {
        context.addIssue({ code: 'custom', path: [index, ...issue.path], message: messageForLens(index, issue.message) });
      }
    });
    const seen = new Map<string, number>();
    parsed.forEach((lens, index) => {
      const key = lens.identifier.toLowerCase();
      const first = seen.get(key);
      if (first !== undefined) {
        context.addIssue({
          code: 'custom',
          path: [index, 'identifier'],
          message: `Field "${lensFieldName(index, 'identifier')}" repeats the identifier "${lens.identifier}" of lens ${first + 1}; each lens needs its own.`,
        });
      } else seen.set(key, index);
    });
    return parsed.length === items.length ? parsed : z.NEVER;
  });

export const workRequestBody = z.strictObject({
  title: trimmedText('title', 200),
  clientReference: optionalText('clientReference', 100).optional(),
  dueDate: isoDateField('dueDate').nullable().optional(),
  notes: optionalText('notes', 5000).optional(),
  decisionRule: z.enum(decisionRules, { error: 'Field "decisionRule" must be "simple" or "guarded".' }).default('simple'),
  lenses: requestedLenses,
});
export type WorkRequestBody = z.input<typeof workRequestBody>;
export type WorkRequestInput = z.output<typeof workRequestBody>;

export interface WorkRequestResponse {
  workOrder: { id: string; number: string; status: WorkOrderStatus; title: string; decisionRule: DecisionRule; lensCount: number };
}
