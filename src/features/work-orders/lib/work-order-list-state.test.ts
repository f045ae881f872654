import { describe, expect, it } from 'vitest';
import {
  changeWorkOrderListState,
  DEFAULT_WORK_ORDER_LIST_STATE,
  describeListRange,
  listRange,
  readWorkOrderListState,
  workOrderListApiQuery,
  writeWorkOrderListState,
  type WorkOrderListState,
} from '@/features/work-orders/lib/work-order-list-state';

const CLIENT_ID = '3f1c2b9a-4d5e-4f60-8a7b-9c0d1e2f3a4b';

function state(overrides: Partial<WorkOrderListState> = {}): WorkOrderListState {
  return { ...DEFAULT_WORK_ORDER_LIST_STATE, ...overrides };
}

describe('readWorkOrderListState / writeWorkOrderListState', () => {
  it('a state written to the URL reads back unchanged, for every filter, sort and page', () => {
    const original = state({
      q: 'plano-convex',
      status: 'in-progress',
      organisationId: CLIENT_ID,
      dueBefore: '2027-01-31',
      sort: 'dueDate',
      order: 'desc',
      page: 3,
      pageSize: 50,
    });
    const params = writeWorkOrderListState(original);
    expect(readWorkOrderListState(new URLSearchParams(params.toString()))).toEqual(original);
  });

  it('the default state writes an empty query, so /work-orders means "everything, newest first"', () => {
    expect(writeWorkOrderListState(state()).toString()).toBe('');
    expect(readWorkOrderListState(new URLSearchParams(''))).toEqual(DEFAULT_WORK_ORDER_LIST_STATE);
  });

  it('readWorkOrderListState falls back to the default for each value a hand-edited link gets wrong', () => {
    const read = readWorkOrderListState(
      new URLSearchParams('status=lost&client=not-a-uuid&dueBefore=2026-02-30&sort=colour&order=up&page=-2&pageSize=7'),
    );
    expect(read).toEqual(DEFAULT_WORK_ORDER_LIST_STATE);
  });

  it('a sort named without an order takes that column’s first order (due dates soonest first)', () => {
    expect(readWorkOrderListState(new URLSearchParams('sort=dueDate'))).toMatchObject({ sort: 'dueDate', order: 'asc' });
  });

  it('search text is trimmed when written, and blank search is left out', () => {
    expect(writeWorkOrderListState(state({ q: '  WO-2026  ' })).get('q')).toBe('WO-2026');
    expect(writeWorkOrderListState(state({ q: '   ' })).has('q')).toBe(false);
  });
});

describe('workOrderListApiQuery', () => {
  it('workOrderListApiQuery uses the API’s own parameter names (organisationId, not the URL’s client)', () => {
    const query = new URLSearchParams(workOrderListApiQuery(state({ organisationId: CLIENT_ID, q: ' lens 7 ', status: 'open' })));
    expect(query.get('organisationId')).toBe(CLIENT_ID);
    expect(query.has('client')).toBe(false);
    expect(query.get('q')).toBe('lens 7');
    expect(query.get('status')).toBe('open');
    expect(Object.fromEntries(query)).toMatchObject({ sort: 'createdAt', order: 'desc', page: '1', pageSize: '25' });
  });

  it('workOrderListApiQuery leaves out filters that are not set', () => {
    const query = new URLSearchParams(workOrderListApiQuery(state()));
    expect([...query.keys()].sort()).toEqual(['order', 'page', 'pageSize', 'sort']);
  });
});

describe('changeWorkOrderListState', () => {
  it('narrowing the list by search or filter goes back to page 1', () => {
    const onPage4 = state({ page: 4 });
    expect(changeWorkOrderListState(onPage4, { kind: 'search', q: 'x' }).page).toBe(1);
    expect(changeWorkOrderListState(onPage4, { kind: 'status', status: 'open' }).page).toBe(1);
    expect(changeWorkOrderListState(onPage4, { kind: 'organisation', organisationId: CLIENT_ID }).page).toBe(1);
    expect(changeWorkOrderListState(onPage4, { kind: 'due-before', dueBefore: '2027-01-01' }).page).toBe(1);
  });

  it('clicking the sorted column reverses it; another column starts in its own first order', () => {
    const byNumberAsc = changeWorkOrderListState(state(), { kind: 'sort', field: 'number' });
    expect(byNumberAsc).toMatchObject({ sort: 'number', order: 'asc' });
    expect(changeWorkOrderListState(byNumberAsc, { kind: 'sort', field: 'number' })).toMatchObject({ sort: 'number', order: 'desc' });
    expect(changeWorkOrderListState(byNumberAsc, { kind: 'sort', field: 'createdAt' })).toMatchObject({ sort: 'createdAt', order: 'desc' });
  });

  it('changing the page size keeps the first row on screen in view', () => {
    // Rows 51–75 at 25 a page; at 10 a page row 51 is on page 6, at 100 on page 1.
    const onPage3 = state({ page: 3, pageSize: 25 });
    expect(changeWorkOrderListState(onPage3, { kind: 'page-size', pageSize: 10 })).toMatchObject({ page: 6, pageSize: 10 });
    expect(changeWorkOrderListState(onPage3, { kind: 'page-size', pageSize: 100 })).toMatchObject({ page: 1, pageSize: 100 });
  });

  it('clearing the filters keeps the sort and page size the person chose', () => {
    const busy = state({ q: 'a', status: 'open', organisationId: CLIENT_ID, dueBefore: '2027-01-01', sort: 'number', order: 'asc', page: 2, pageSize: 50 });
    expect(changeWorkOrderListState(busy, { kind: 'clear-filters' })).toEqual(state({ sort: 'number', order: 'asc', pageSize: 50 }));
  });

  it('a page below 1 becomes page 1, and an invalid due date clears the filter', () => {
    expect(changeWorkOrderListState(state({ page: 2 }), { kind: 'page', page: 0 }).page).toBe(1);
    expect(changeWorkOrderListState(state(), { kind: 'due-before', dueBefore: '2026-13-01' }).dueBefore).toBeNull();
  });
});

describe('listRange and describeListRange', () => {
  it('describeListRange says "Showing 26–50 of 132" for the second page of 25', () => {
    expect(describeListRange(listRange({ page: 2, pageSize: 25, total: 132 }))).toBe('Showing 26–50 of 132');
  });

  it('the last page ends at the total, and the page count rounds up', () => {
    expect(listRange({ page: 6, pageSize: 25, total: 132 })).toEqual({ firstRow: 126, lastRow: 132, total: 132, pageCount: 6 });
  });

  it('an empty list has one page and says so in words', () => {
    const empty = listRange({ page: 1, pageSize: 25, total: 0 });
    expect(empty.pageCount).toBe(1);
    expect(describeListRange(empty)).toBe('No work orders');
    expect(describeListRange(listRange({ page: 1, pageSize: 25, total: 1 }))).toBe('Showing 1 of 1');
  });
});
