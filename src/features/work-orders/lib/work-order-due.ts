import type { WorkOrderStatus } from '@shared/schemas/work-orders';

/** The calendar day of `date` in the browser's time zone, as YYYY-MM-DD (the form due dates are stored in). */
export function localIsoDate(date: Date): string {
  const month = String(date.getMonth() + 1).padStart(2, '0');
  const day = String(date.getDate()).padStart(2, '0');
  return `${date.getFullYear()}-${month}-${day}`;
}

/** Whole days from `fromIsoDate` to `toIsoDate` (negative when `to` is earlier). */
export function daysBetween(fromIsoDate: string, toIsoDate: string): number {
  const toUtcMs = (iso: string) => {
    const [year, month, day] = iso.split('-').map(Number);
    return Date.UTC(year, month - 1, day);
  };
  return Math.round((toUtcMs(toIsoDate) - toUtcMs(fromIsoDate)) / 86_400_000);
}

export type DueStanding = 'none' | 'closed' | 'on-time' | 'due-today' | 'overdue';

export interface WorkOrderDueState {
  standing: DueStanding;
  /** Days from today to the due date; negative once overdue; null without a due date. */
  daysLeft: number | null;
  /** Short words for a table cell, e.g. "3 days late". */
  note: string | null;
}

/**
 * Whether a work order is late. A completed or cancelled order is never
 * overdue, whatever its date: the lab is done with it.
 */
export function workOrderDueState({
  dueDate,
  status,
  todayIsoDate,
}: {
  dueDate: string | null;
  status: WorkOrderStatus;
  todayIsoDate: string;
}): WorkOrderDueState {
  if (dueDate === null) return { standing: 'none', daysLeft: null, note: null };
  const daysLeft = daysBetween(todayIsoDate, dueDate);
  if (status === 'completed' || status === 'cancelled') return { standing: 'closed', daysLeft, note: null };
  if (daysLeft < 0) {
    const late = -daysLeft;
    return { standing: 'overdue', daysLeft, note: late === 1 ? '1 day late' : `${late} days late` };
  }
  if (daysLeft === 0) return { standing: 'due-today', daysLeft, note: 'due today' };
  return { standing: 'on-time', daysLeft, note: daysLeft === 1 ? 'tomorrow' : daysLeft <= 14 ? `in ${daysLeft} days` : null };
}
