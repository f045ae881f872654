/**
 * From what a person typed in the work-order forms to the request body the
 * server expects (docs/api-bench.md). Obvious gaps are caught here so the
 * person gets the sentence at once; the server checks everything again.
 */
import type {
  CreateWorkOrderBody,
  DecisionRule,
  UpdateWorkOrderBody,
  WorkOrderDetail,
  WorkOrderStatus,
} from '@shared/schemas/work-orders';
import { isIsoDate } from '@/features/work-orders/lib/work-order-list-state';

export interface WorkOrderDraft {
  organisationId: string;
  title: string;
  clientReference: string;
  dueDate: string;
  decisionRule: DecisionRule;
  notes: string;
}

export const EMPTY_WORK_ORDER_DRAFT: Readonly<WorkOrderDraft> = Object.freeze({
  organisationId: '',
  title: '',
  clientReference: '',
  dueDate: '',
  decisionRule: 'simple',
  notes: '',
});

/** Sentences keyed by the request's field names, as the server's `error.fields` are. */
export type FieldProblems = Partial<Record<string, string>>;

export type DraftOutcome<Request> = { ok: true; request: Request } | { ok: false; problems: FieldProblems };

const TITLE_MAX_CHARACTERS = 200;

export function createWorkOrderRequest(draft: WorkOrderDraft, { todayIsoDate }: { todayIsoDate: string }): DraftOutcome<CreateWorkOrderBody> {
  const problems: FieldProblems = {};
  const title = draft.title.trim();
  const clientReference = draft.clientReference.trim();
  const notes = draft.notes.trim();
  const dueDate = draft.dueDate.trim();

  if (draft.organisationId === '') problems.organisationId = 'Choose the client organisation the work is for.';
  if (title === '') problems.title = 'Give the work order a title, e.g. what the client sent.';
  else if (title.length > TITLE_MAX_CHARACTERS) problems.title = `Keep the title to ${TITLE_MAX_CHARACTERS} characters; put the rest in the notes.`;
  if (dueDate !== '') {
    if (!isIsoDate(dueDate)) problems.dueDate = 'Enter the due date as a calendar date (YYYY-MM-DD).';
    else if (dueDate < todayIsoDate) problems.dueDate = 'The due date is already past; choose today or a later day.';
  }
  if (Object.keys(problems).length > 0) return { ok: false, problems };

  const request: CreateWorkOrderBody = { organisationId: draft.organisationId, title, decisionRule: draft.decisionRule };
  if (clientReference !== '') request.clientReference = clientReference;
  if (dueDate !== '') request.dueDate = dueDate;
  if (notes !== '') request.notes = notes;
  return { ok: true, request };
}

export interface WorkOrderProgressDraft {
  status: WorkOrderStatus;
  dueDate: string;
}

/**
 * The PATCH body for the status / due-date edit: only what changed, and an
 * emptied due date is sent as null (the order no longer has one). A past due
 * date is allowed here, since correcting a record may need one.
 */
export function updateWorkOrderProgressRequest(
  current: Pick<WorkOrderDetail, 'status' | 'dueDate'>,
  draft: WorkOrderProgressDraft,
): DraftOutcome<UpdateWorkOrderBody> {
  const dueDate = draft.dueDate.trim();
  if (dueDate !== '' && !isIsoDate(dueDate)) {
    return { ok: false, problems: { dueDate: 'Enter the due date as a calendar date (YYYY-MM-DD), or leave it empty.' } };
  }
  const request: UpdateWorkOrderBody = {};
  if (draft.status !== current.status) request.status = draft.status;
  const nextDueDate = dueDate === '' ? null : dueDate;
  if (nextDueDate !== current.dueDate) request.dueDate = nextDueDate;
  return { ok: true, request };
}
