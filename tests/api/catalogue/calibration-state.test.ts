import { describe, expect, it } from 'vitest';
import { CALIBRATION_DUE_SOON_DAYS } from '../../../shared/schemas/equipment';
import { InvariantError } from '../../../server/invariant';
import { calibrationStateOf, daysBetween, todayIsoDate } from '../../../server/services/equipment';

describe('calibrationStateOf', () => {
  it('calls equipment usable through its due date and overdue from the next day', () => {
    expect(calibrationStateOf('2026-03-31', '2026-03-31')).toBe('due-soon');
    expect(calibrationStateOf('2026-03-31', '2026-04-01')).toBe('overdue');
    expect(calibrationStateOf('2025-12-31', '2026-06-01')).toBe('overdue');
  });

  it(`calls it due-soon within ${CALIBRATION_DUE_SOON_DAYS} days of the due date and current before that`, () => {
    expect(CALIBRATION_DUE_SOON_DAYS).toBe(30);
    expect(calibrationStateOf('2026-03-31', '2026-03-01')).toBe('due-soon'); // 30 days left
    expect(calibrationStateOf('2026-03-31', '2026-02-28')).toBe('current'); // 31 days left
  });

  it('counts calendar days across a leap day and a year end', () => {
    expect(daysBetween('2028-02-28', '2028-03-01')).toBe(2);
    expect(daysBetween('2026-12-31', '2027-01-01')).toBe(1);
    expect(daysBetween('2027-01-01', '2026-12-31')).toBe(-1);
  });

  it('treats a date that is not YYYY-MM-DD as a bug', () => {
    expect(() => calibrationStateOf('31/03/2026', '2026-03-01')).toThrow(InvariantError);
    expect(() => calibrationStateOf('2026-02-30', '2026-03-01')).toThrow(InvariantError);
  });
});

describe('todayIsoDate', () => {
  it('writes the local calendar date as YYYY-MM-DD', () => {
    expect(todayIsoDate(new Date(2026, 0, 5, 23, 59))).toBe('2026-01-05');
    expect(todayIsoDate(new Date(2026, 11, 31, 0, 0))).toBe('2026-12-31');
  });
});
