/**
 * The work-order table's state (search, filters, sort, page) as it lives in
 * the page's URL, and the API query it asks for. Only values that differ
 * from the defaults are written to the URL, so a shared link stays short and
 * the plain `/work-orders` address means "everything, newest first".
 */
import {
  WORK_ORDER_PAGE_SIZE_MAX,
  workOrderSortFields,
  workOrderStatuses,
  type SortOrder,
  type WorkOrderSortField,
  type WorkOrderStatus,
} from '@shared/schemas/work-orders';

export type { SortOrder, WorkOrderSortField };

/** The columns the server can sort by; any other column's heading is plain text. */
export function isSortableField(field: string): field is WorkOrderSortField {
  return (workOrderSortFields as readonly string[]).includes(field);
}

export const PAGE_SIZE_CHOICES = [10, 25, 50, WORK_ORDER_PAGE_SIZE_MAX] as const;
export type PageSizeChoice = (typeof PAGE_SIZE_CHOICES)[number];

export interface WorkOrderListState {
  /** Free-text search as typed; trimmed before it is sent. */
  q: string;
  status: WorkOrderStatus | null;
  organisationId: string | null;
  /** YYYY-MM-DD: only orders due on or before this day. */
  dueBefore: string | null;
  sort: WorkOrderSortField;
  order: SortOrder;
  page: number;
  pageSize: PageSizeChoice;
}

export const DEFAULT_WORK_ORDER_LIST_STATE: Readonly<WorkOrderListState> = Object.freeze({
  q: '',
  status: null,
  organisationId: null,
  dueBefore: null,
  sort: 'createdAt',
  order: 'desc',
  page: 1,
  pageSize: 25,
});

/** The first click on a column sorts the way a person usually reads it: dates soonest first, creation newest first. */
export const FIRST_SORT_ORDER: Record<WorkOrderSortField, SortOrder> = {
  number: 'asc',
  organisation: 'asc',
  status: 'asc',
  dueDate: 'asc',
  createdAt: 'desc',
};

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function isIsoDate(text: string): boolean {
  if (!ISO_DATE.test(text)) return false;
  const [year, month, day] = text.split('-').map(Number);
  const date = new Date(Date.UTC(year, month - 1, day));
  return date.getUTCFullYear() === year && date.getUTCMonth() === month - 1 && date.getUTCDate() === day;
}

function oneOf<T extends string | number>(choices: readonly T[], value: unknown): T | null {
  return choices.includes(value as T) ? (value as T) : null;
}

/**
 * Reads the state from a URL's query. A hand-edited or outdated link never
 * breaks the page: every value that does not parse falls back to its default.
 */
export function readWorkOrderListState(params: URLSearchParams): WorkOrderListState {
  const defaults = DEFAULT_WORK_ORDER_LIST_STATE;
  const page = Number(params.get('page'));
  const organisationId = params.get('client');
  const dueBefore = params.get('dueBefore');
  const sort = oneOf(workOrderSortFields, params.get('sort')) ?? defaults.sort;
  return {
    q: params.get('q') ?? defaults.q,
    status: oneOf(workOrderStatuses, params.get('status')),
    organisationId: organisationId && UUID.test(organisationId) ? organisationId : null,
    dueBefore: dueBefore && isIsoDate(dueBefore) ? dueBefore : null,
    sort,
    order: oneOf(['asc', 'desc'] as const, params.get('order')) ?? (params.has('sort') ? FIRST_SORT_ORDER[sort] : defaults.order),
    page: Number.isInteger(page) && page >= 1 ? page : defaults.page,
    pageSize: oneOf(PAGE_SIZE_CHOICES, Number(params.get('pageSize'))) ?? defaults.pageSize,
  };
}

/** Writes the state back as URL query parameters, leaving out what equals the default. */
export function writeWorkOrderListState(state: WorkOrderListState): URLSearchParams {
  const defaults = DEFAULT_WORK_ORDER_LIST_STATE;
  const params = new URLSearchParams();
  if (state.q.trim() !== '') params.set('q', state.q.trim());
  if (state.status) params.set('status', state.status);
  if (state.organisationId) params.set('client', state.organisationId);
  if (state.dueBefore) params.set('dueBefore', state.dueBefore);
  if (state.sort !== defaults.sort || state.order !== defaults.order) {
    params.set('sort', state.sort);
    params.set('order', state.order);
  }
  if (state.page !== defaults.page) params.set('page', String(state.page));
  if (state.pageSize !== defaults.pageSize) params.set('pageSize', String(state.pageSize));
  return params;
}

/** The query string for `GET /api/work-orders` (docs/api-bench.md), always explicit about sort and page. */
export function workOrderListApiQuery(state: WorkOrderListState): string {
  const params = new URLSearchParams();
  const q = state.q.trim();
  if (q !== '') params.set('q', q);
  if (state.status) params.set('status', state.status);
  if (state.organisationId) params.set('organisationId', state.organisationId);
  if (state.dueBefore) params.set('dueBefore', state.dueBefore);
  params.set('sort', state.sort);
  params.set('order', state.order);
  params.set('page', String(state.page));
  params.set('pageSize', String(state.pageSize));
  return params.toString();
}

export type WorkOrderListChange =
  | { kind: 'search'; q: string }
  | { kind: 'status'; status: WorkOrderStatus | null }
  | { kind: 'organisation'; organisationId: string | null }
  | { kind: 'due-before'; dueBefore: string | null }
  | { kind: 'sort'; field: WorkOrderSortField }
  | { kind: 'page'; page: number }
  | { kind: 'page-size'; pageSize: PageSizeChoice }
  | { kind: 'clear-filters' };

/**
 * The next state after one change. Narrowing or re-sorting the list starts
 * again at page 1 (page 4 of the old list means nothing in the new one);
 * clicking the sorted column again reverses it.
 */
export function changeWorkOrderListState(state: WorkOrderListState, change: WorkOrderListChange): WorkOrderListState {
  const firstPage = { ...state, page: 1 };
  switch (change.kind) {
    case 'search':
      return { ...firstPage, q: change.q };
    case 'status':
      return { ...firstPage, status: change.status };
    case 'organisation':
      return { ...firstPage, organisationId: change.organisationId };
    case 'due-before':
      return { ...firstPage, dueBefore: change.dueBefore && isIsoDate(change.dueBefore) ? change.dueBefore : null };
    case 'sort':
      return state.sort === change.field
        ? { ...firstPage, order: state.order === 'asc' ? 'desc' : 'asc' }
        : { ...firstPage, sort: change.field, order: FIRST_SORT_ORDER[change.field] };
    case 'page':
      return { ...state, page: Math.max(1, Math.floor(change.page)) };
    case 'page-size': {
      // Keep the first row that was on screen in view.
      const firstRowIndex = (state.page - 1) * state.pageSize;
      return { ...state, pageSize: change.pageSize, page: Math.floor(firstRowIndex / change.pageSize) + 1 };
    }
    case 'clear-filters':
      return { ...DEFAULT_WORK_ORDER_LIST_STATE, sort: state.sort, order: state.order, pageSize: state.pageSize };
  }
}

export function hasActiveFilters(state: WorkOrderListState): boolean {
  return state.q.trim() !== '' || state.status !== null || state.organisationId !== null || state.dueBefore !== null;
}

export interface ListRange {
  firstRow: number;
  lastRow: number;
  total: number;
  pageCount: number;
}

/** Which rows a page shows, numbered from 1; an empty list shows rows 0–0. */
export function listRange({ page, pageSize, total }: { page: number; pageSize: number; total: number }): ListRange {
  const pageCount = Math.max(1, Math.ceil(total / pageSize));
  if (total === 0) return { firstRow: 0, lastRow: 0, total, pageCount };
  const firstRow = Math.min((page - 1) * pageSize + 1, total);
  return { firstRow, lastRow: Math.min(page * pageSize, total), total, pageCount };
}

/** "Showing 26–50 of 132". */
export function describeListRange(range: ListRange, noun = 'work orders'): string {
  if (range.total === 0) return `No ${noun}`;
  if (range.firstRow === range.lastRow) return `Showing ${range.firstRow} of ${range.total}`;
  return `Showing ${range.firstRow}–${range.lastRow} of ${range.total}`;
}
