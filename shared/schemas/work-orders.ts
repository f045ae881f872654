/**
 * Work orders and organisations as the API takes and returns them
 * (docs/api-bench.md, "Organisations" and "Work orders"). Shared by the
 * server's validators and the client; no Node APIs here.
 */
import { z } from 'zod';
import type { LensSummary } from './lenses';

/* Kept equal to the database enums in server/db/schema.ts (a test checks it). */
export const workOrderStatuses = ['requested', 'open', 'in-progress', 'completed', 'cancelled'] as const;
export type WorkOrderStatus = (typeof workOrderStatuses)[number];

export const decisionRules = ['simple', 'guarded'] as const;
export type DecisionRule = (typeof decisionRules)[number];

export const organisationKinds = ['lab', 'client'] as const;
export type OrganisationKind = (typeof organisationKinds)[number];

export const workOrderSortFields = ['number', 'dueDate', 'createdAt', 'status', 'organisation'] as const;
export type WorkOrderSortField = (typeof workOrderSortFields)[number];

export const sortOrders = ['asc', 'desc'] as const;

/** `page` of a paginated list: a whole number, 1 or more. */
export function pageField() {
  const message = 'Field "page" must be a whole number, 1 or more.';
  return z.coerce
    .number({ error: message })
    .int({ error: message })
    .min(1, { error: message })
    .max(1_000_000, { error: 'Field "page" must be at most 1000000.' })
    .default(1);
}

/** `q` of a list: trimmed search text up to 200 characters; empty means no search. */
export function searchTextField() {
  return z
    .string({ error: 'Field "q" must be text.' })
    .trim()
    .max(200, { error: 'Field "q" must be at most 200 characters long.' })
    .optional()
    .transform((value) => (value ? value : undefined));
}

/** `pageSize` of a paginated list: a whole number from 1 to `max`. */
export function pageSizeField(max: number, defaultSize: number) {
  const message = `Field "pageSize" must be a whole number from 1 to ${max}.`;
  return z.coerce.number({ error: message }).int({ error: message }).min(1, { error: message }).max(max, { error: message }).default(defaultSize);
}
export type SortOrder = (typeof sortOrders)[number];

export const WORK_ORDER_PAGE_SIZE_DEFAULT = 25;
export const WORK_ORDER_PAGE_SIZE_MAX = 100;

/** True for a real calendar date written YYYY-MM-DD (2026-02-30 is not one). */
export function isIsoCalendarDate(text: string): boolean {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  if (!match) return false;
  const [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])];
  const date = new Date(Date.UTC(year, month - 1, day));
  return date.getUTCFullYear() === year && date.getUTCMonth() === month - 1 && date.getUTCDate() === day;
}

/** A calendar date field, YYYY-MM-DD. */
export function isoDateField(field: string) {
  return z
    .string({ error: `Field "${field}" must be a date written YYYY-MM-DD.` })
    .refine(isIsoCalendarDate, { error: `Field "${field}" must be a real date written YYYY-MM-DD (e.g. 2026-03-31).` });
}

/** Required text, trimmed, not empty. */
export function trimmedText(field: string, maxLength: number) {
  return z
    .string({ error: `Field "${field}" must be text.` })
    .trim()
    .min(1, { error: `Field "${field}" must not be empty.` })
    .max(maxLength, { error: `Field "${field}" must be at most ${maxLength} characters long.` });
}

/** Optional free text: an empty string is stored as null. */
export function optionalText(field: string, maxLength: number) {
  return z
    .string({ error: `Field "${field}" must be text.` })
    .trim()
    .max(maxLength, { error: `Field "${field}" must be at most ${maxLength} characters long.` })
    .nullable()
    .transform((value) => (value === null || value === '' ? null : value));
}

export const uuidField = (field: string) => z.uuid({ error: `Field "${field}" must be an id (a UUID).` });

/* ------------------------------ organisations ----------------------------- */

export const listOrganisationsQuery = z.strictObject({
  kind: z.enum(organisationKinds, { error: 'Field "kind" must be "client" or "lab".' }).optional(),
});
export type ListOrganisationsQuery = z.output<typeof listOrganisationsQuery>;

export interface OrganisationSummary {
  id: string;
  name: string;
  kind: OrganisationKind;
}

export interface OrganisationListResponse {
  items: OrganisationSummary[];
}

/* ------------------------------- work orders ------------------------------ */

export const workOrderIdParams = z.object({ workOrderId: uuidField('workOrderId') });

/**
 * `q` searches number, title, client reference, organisation name and lens
 * identifiers (case-insensitive, as plain text). `status` takes one status or
 * several separated by commas. `dueBefore`/`dueAfter` are inclusive.
 */
export const listWorkOrdersQuery = z
  .strictObject({
    q: searchTextField(),
    status: z
      .string({ error: 'Field "status" must be text.' })
      .transform((value, context) => {
        const statuses = value.split(',').map((part) => part.trim()).filter(Boolean);
        const unknown = statuses.filter((status) => !(workOrderStatuses as readonly string[]).includes(status));
        if (statuses.length === 0 || unknown.length > 0) {
          context.addIssue({
            code: 'custom',
            message: `Field "status" must be one or more of: ${workOrderStatuses.join(', ')} (comma-separated).`,
          });
          return z.NEVER;
        }
        return statuses as WorkOrderStatus[];
      })
      .optional(),
    organisationId: uuidField('organisationId').optional(),
    dueBefore: isoDateField('dueBefore').optional(),
    dueAfter: isoDateField('dueAfter').optional(),
    sort: z.enum(workOrderSortFields, { error: `Field "sort" must be one of: ${workOrderSortFields.join(', ')}.` }).optional(),
    order: z.enum(sortOrders, { error: 'Field "order" must be "asc" or "desc".' }).optional(),
    page: pageField(),
    pageSize: pageSizeField(WORK_ORDER_PAGE_SIZE_MAX, WORK_ORDER_PAGE_SIZE_DEFAULT),
  })
  .refine((query) => !query.dueBefore || !query.dueAfter || query.dueAfter <= query.dueBefore, {
    error: 'Field "dueAfter" must not be later than "dueBefore".',
    path: ['dueAfter'],
  });
export type ListWorkOrdersQuery = z.output<typeof listWorkOrdersQuery>;
/** What the client puts in the query string (all optional, as text or numbers). */
export type ListWorkOrdersParams = Partial<{
  q: string;
  status: string;
  organisationId: string;
  dueBefore: string;
  dueAfter: string;
  sort: WorkOrderSortField;
  order: SortOrder;
  page: number;
  pageSize: number;
}>;

export const createWorkOrderBody = z.strictObject({
  organisationId: uuidField('organisationId'),
  title: trimmedText('title', 200),
  clientReference: optionalText('clientReference', 100).optional(),
  dueDate: isoDateField('dueDate').nullable().optional(),
  decisionRule: z.enum(decisionRules, { error: 'Field "decisionRule" must be "simple" or "guarded".' }),
  notes: optionalText('notes', 5000).optional(),
});
export type CreateWorkOrderBody = z.input<typeof createWorkOrderBody>;
export type CreateWorkOrderInput = z.output<typeof createWorkOrderBody>;

export const updateWorkOrderBody = z
  .strictObject({
    title: trimmedText('title', 200).optional(),
    clientReference: optionalText('clientReference', 100).optional(),
    dueDate: isoDateField('dueDate').nullable().optional(),
    decisionRule: z.enum(decisionRules, { error: 'Field "decisionRule" must be "simple" or "guarded".' }).optional(),
    notes: optionalText('notes', 5000).optional(),
    status: z.enum(workOrderStatuses, { error: `Field "status" must be one of: ${workOrderStatuses.join(', ')}.` }).optional(),
  })
  .refine((body) => Object.values(body).some((value) => value !== undefined), {
    error: 'Send at least one of the fields title, clientReference, dueDate, decisionRule, notes, status.',
  });
export type UpdateWorkOrderBody = z.input<typeof updateWorkOrderBody>;
export type UpdateWorkOrderInput = z.output<typeof updateWorkOrderBody>;

export interface WorkOrderListItem {
  id: string;
  number: string;
  title: string;
  clientReference: string | null;
  organisation: { id: string; name: string };
  status: WorkOrderStatus;
  /** YYYY-MM-DD or null. */
  dueDate: string | null;
  decisionRule: DecisionRule;
  lensCount: number;
  measurementCount: number;
  /** ISO 8601 timestamp. */
  createdAt: string;
}

export interface WorkOrderListResponse {
  items: WorkOrderListItem[];
  total: number;
  page: number;
  pageSize: number;
}

export interface WorkOrderDetail extends WorkOrderListItem {
  notes: string | null;
  createdBy: { id: string; name: string } | null;
  /** ISO 8601 timestamp. */
  updatedAt: string;
  lenses: LensSummary[];
}

export interface WorkOrderResponse {
  workOrder: WorkOrderDetail;
}
