import { describe, expect, it } from 'vitest';
import { createWorkOrderRequest, EMPTY_WORK_ORDER_DRAFT, updateWorkOrderProgressRequest, type WorkOrderDraft } from '@/features/work-orders/lib/work-order-request';
import { createWorkOrderBody } from '@shared/schemas/work-orders';

const ORGANISATION_ID = '8d6f0c1e-2a3b-4c5d-9e8f-7a6b5c4d3e2f';
const today = '2026-12-01';

function draft(overrides: Partial<WorkOrderDraft>): WorkOrderDraft {
  return { ...EMPTY_WORK_ORDER_DRAFT, ...overrides };
}

describe('createWorkOrderRequest', () => {
  it('createWorkOrderRequest trims the text and leaves empty optional fields out of the request', () => {
    const outcome = createWorkOrderRequest(draft({ organisationId: ORGANISATION_ID, title: '  Incoming batch  ', clientReference: ' ', notes: '' }), { todayIsoDate: today });
    expect(outcome).toEqual({ ok: true, request: { organisationId: ORGANISATION_ID, title: 'Incoming batch', decisionRule: 'simple' } });
  });

  it('the request it builds passes the server’s own validator (shared createWorkOrderBody)', () => {
    const outcome = createWorkOrderRequest(
      draft({ organisationId: ORGANISATION_ID, title: 'Doublets', clientReference: 'PO-5531', dueDate: '2026-12-20', decisionRule: 'guarded', notes: 'Handle with gloves.' }),
      { todayIsoDate: today },
    );
    expect(outcome.ok).toBe(true);
    if (outcome.ok) expect(createWorkOrderBody.safeParse(outcome.request).success).toBe(true);
  });

  it('createWorkOrderRequest names each missing or wrong field with a sentence, keyed as the server keys them', () => {
    const outcome = createWorkOrderRequest(draft({ title: ' ', dueDate: '2026-11-30' }), { todayIsoDate: today });
    expect(outcome.ok).toBe(false);
    if (!outcome.ok) {
      expect(Object.keys(outcome.problems).sort()).toEqual(['dueDate', 'organisationId', 'title']);
      expect(outcome.problems.dueDate).toBe('The due date is already past; choose today or a later day.');
      expect(outcome.problems.organisationId).toBe('Choose the client organisation the work is for.');
    }
  });

  it('a due date that is not a real calendar day is refused', () => {
    const outcome = createWorkOrderRequest(draft({ organisationId: ORGANISATION_ID, title: 'x', dueDate: '2027-02-29' }), { todayIsoDate: today });
    expect(outcome.ok === false && outcome.problems.dueDate).toBe('Enter the due date as a calendar date (YYYY-MM-DD).');
  });
});

describe('updateWorkOrderProgressRequest', () => {
  const current = { status: 'open' as const, dueDate: '2026-12-20' };

  it('updateWorkOrderProgressRequest sends only what changed', () => {
    expect(updateWorkOrderProgressRequest(current, { status: 'in-progress', dueDate: '2026-12-20' })).toEqual({ ok: true, request: { status: 'in-progress' } });
    expect(updateWorkOrderProgressRequest(current, { status: 'open', dueDate: '2026-12-20' })).toEqual({ ok: true, request: {} });
  });

  it('emptying the due date sends null, which removes it', () => {
    expect(updateWorkOrderProgressRequest(current, { status: 'open', dueDate: '' })).toEqual({ ok: true, request: { dueDate: null } });
  });

  it('a past due date may be recorded when correcting an order', () => {
    expect(updateWorkOrderProgressRequest(current, { status: 'open', dueDate: '2026-01-15' })).toEqual({ ok: true, request: { dueDate: '2026-01-15' } });
  });
});
