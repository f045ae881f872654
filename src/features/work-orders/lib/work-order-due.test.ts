import { describe, expect, it } from 'vitest';
import { daysBetween, localIsoDate, workOrderDueState } from '@/features/work-orders/lib/work-order-due';

describe('workOrderDueState', () => {
  const today = '2026-12-01';

  it('an open order past its due date is overdue, with the days it is late', () => {
    expect(workOrderDueState({ dueDate: '2026-11-28', status: 'in-progress', todayIsoDate: today })).toEqual({
      standing: 'overdue',
      daysLeft: -3,
      note: '3 days late',
    });
    expect(workOrderDueState({ dueDate: '2026-11-30', status: 'open', todayIsoDate: today }).note).toBe('1 day late');
  });

  it('a completed or cancelled order is never overdue, whatever its date', () => {
    expect(workOrderDueState({ dueDate: '2026-01-01', status: 'completed', todayIsoDate: today }).standing).toBe('closed');
    expect(workOrderDueState({ dueDate: '2026-01-01', status: 'cancelled', todayIsoDate: today }).standing).toBe('closed');
  });

  it('the due day itself is "due today", not late', () => {
    expect(workOrderDueState({ dueDate: today, status: 'open', todayIsoDate: today })).toMatchObject({ standing: 'due-today', daysLeft: 0 });
  });

  it('an order without a due date has no standing', () => {
    expect(workOrderDueState({ dueDate: null, status: 'open', todayIsoDate: today })).toEqual({ standing: 'none', daysLeft: null, note: null });
  });
});

describe('daysBetween and localIsoDate', () => {
  it('daysBetween counts calendar days across a month end and a leap day', () => {
    expect(daysBetween('2026-11-30', '2026-12-01')).toBe(1);
    expect(daysBetween('2028-02-28', '2028-03-01')).toBe(2); // 2028 is a leap year (Gregorian rule, from memory)
    expect(daysBetween('2026-12-01', '2026-11-01')).toBe(-30);
  });

  it('localIsoDate writes the local calendar day with zero padding', () => {
    expect(localIsoDate(new Date(2026, 0, 5, 23, 59))).toBe('2026-01-05');
  });
});
