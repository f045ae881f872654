import { CALIBRATION_DUE_SOON_DAYS, type CalibrationState } from '@shared/schemas/equipment';

/** Within this many days of its due date (today included) an item counts as "due soon" (docs/api-bench.md). */
export const DUE_SOON_DAYS = CALIBRATION_DUE_SOON_DAYS;

function daysBetween(fromIsoDate: string, toIsoDate: string): number {
  const utcMs = (iso: string) => {
    const [year, month, day] = iso.split('-').map(Number);
    return Date.UTC(year, month - 1, day);
  };
  return Math.round((utcMs(toIsoDate) - utcMs(fromIsoDate)) / 86_400_000);
}

export interface CalibrationDue {
  state: CalibrationState;
  /** Days from today to the due date; negative once past it. */
  daysLeft: number;
  /** The words shown: "Current", "Due in 12 days", "Overdue since 2026-11-03". */
  text: string;
}

/**
 * How an item's calibration stands today. The server's own state wins when it
 * is given (it also decides whether the item may be used); without it the
 * state is worked out here from the dates the same way.
 */
export function describeCalibrationDue({
  calibrationDueDate,
  todayIsoDate,
  serverState,
  serverDaysLeft,
}: {
  calibrationDueDate: string;
  todayIsoDate: string;
  serverState?: CalibrationState;
  /** The server's count of days, which uses the lab's calendar rather than the browser's. */
  serverDaysLeft?: number;
}): CalibrationDue {
  const daysLeft = serverDaysLeft ?? daysBetween(todayIsoDate, calibrationDueDate);
  const state: CalibrationState = serverState ?? (daysLeft < 0 ? 'overdue' : daysLeft <= DUE_SOON_DAYS ? 'due-soon' : 'current');
  if (state === 'overdue') {
    const late = -daysLeft;
    return { state, daysLeft, text: late > 0 ? `Overdue since ${calibrationDueDate}` : 'Overdue' };
  }
  if (state === 'due-soon') {
    const text = daysLeft <= 0 ? 'Due today' : daysLeft === 1 ? 'Due tomorrow' : `Due in ${daysLeft} days`;
    return { state, daysLeft, text };
  }
  return { state, daysLeft, text: 'Current' };
}
