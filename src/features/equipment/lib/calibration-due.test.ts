import { describe, expect, it } from 'vitest';
import { describeCalibrationDue, DUE_SOON_DAYS } from '@/features/equipment/lib/calibration-due';

const today = '2026-12-01';

describe('describeCalibrationDue', () => {
  it('describeCalibrationDue counts the days left while the due date is near', () => {
    expect(describeCalibrationDue({ calibrationDueDate: '2026-12-13', todayIsoDate: today })).toEqual({ state: 'due-soon', daysLeft: 12, text: 'Due in 12 days' });
    expect(describeCalibrationDue({ calibrationDueDate: '2026-12-02', todayIsoDate: today }).text).toBe('Due tomorrow');
    expect(describeCalibrationDue({ calibrationDueDate: today, todayIsoDate: today }).text).toBe('Due today');
  });

  it(`an item is current until ${DUE_SOON_DAYS} days before its due date, and due soon from then (docs/api-bench.md)`, () => {
    expect(describeCalibrationDue({ calibrationDueDate: '2027-01-01', todayIsoDate: today })).toMatchObject({ state: 'current', daysLeft: 31, text: 'Current' });
    expect(describeCalibrationDue({ calibrationDueDate: '2026-12-31', todayIsoDate: today })).toMatchObject({ state: 'due-soon', daysLeft: 30 });
  });

  it('past its due date an item is "overdue since" that date', () => {
    expect(describeCalibrationDue({ calibrationDueDate: '2026-11-03', todayIsoDate: today })).toEqual({
      state: 'overdue',
      daysLeft: -28,
      text: 'Overdue since 2026-11-03',
    });
  });

  it('the server’s state and day count win over the browser’s calendar', () => {
    const due = describeCalibrationDue({ calibrationDueDate: '2026-12-02', todayIsoDate: today, serverState: 'overdue', serverDaysLeft: -1 });
    expect(due).toEqual({ state: 'overdue', daysLeft: -1, text: 'Overdue since 2026-12-02' });
  });
});
