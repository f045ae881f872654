import { describe, expect, it } from 'vitest';
import { equipmentKinds } from '../../../shared/schemas/equipment';
import { lensKindOf, lensMeasurementStatuses, powerDioptresFromFocalLengthMm, toleranceBandOf } from '../../../shared/schemas/lenses';
import { decisionRules, isIsoCalendarDate, organisationKinds, workOrderStatuses } from '../../../shared/schemas/work-orders';
import {
  decisionRuleValues,
  equipmentKindValues,
  measurementStatusValues,
  organisationKindValues,
  workOrderStatusValues,
} from '../../../server/db/schema';

describe('shared catalogue schemas', () => {
  it('list the same enum values as the database, in the same order', () => {
    expect(workOrderStatuses).toEqual(workOrderStatusValues);
    expect(decisionRules).toEqual(decisionRuleValues);
    expect(organisationKinds).toEqual(organisationKindValues);
    expect(equipmentKinds).toEqual(equipmentKindValues);
    expect(lensMeasurementStatuses).toEqual(measurementStatusValues);
  });

  it('isIsoCalendarDate accepts real dates only', () => {
    expect(isIsoCalendarDate('2028-02-29')).toBe(true);
    expect(isIsoCalendarDate('2026-02-29')).toBe(false);
    expect(isIsoCalendarDate('2026-13-01')).toBe(false);
    expect(isIsoCalendarDate('2026-1-01')).toBe(false);
    expect(isIsoCalendarDate('2026-01-01T00:00')).toBe(false);
  });

  it('derives power as 1000/f and the kind from the sign', () => {
    // From memory: optical power in dioptres is 1/f with f in metres.
    expect(powerDioptresFromFocalLengthMm(250)).toBe(4);
    expect(powerDioptresFromFocalLengthMm(-50)).toBe(-20);
    expect(lensKindOf(-50)).toBe('diverging');
    expect(lensKindOf(100)).toBe('converging');
  });

  it('toleranceBandOf applies the tighter of a percentage and an absolute tolerance', () => {
    expect(toleranceBandOf({ nominalFocalLengthMm: 100, tolerancePercent: 1, toleranceMm: null })).toEqual({
      lowerLimitMm: 99,
      upperLimitMm: 101,
      halfWidthMm: 1,
    });
    expect(toleranceBandOf({ nominalFocalLengthMm: -50, tolerancePercent: 2, toleranceMm: 0.5 })).toEqual({
      lowerLimitMm: -50.5,
      upperLimitMm: -49.5,
      halfWidthMm: 0.5,
    });
    expect(toleranceBandOf({ nominalFocalLengthMm: 200, tolerancePercent: 0.25, toleranceMm: 1 }).halfWidthMm).toBe(0.5);
  });
});
