import { describe, expect, it } from 'vitest';
import type { MeasurementListItem } from '@shared/schemas/measurements';
import { groupOpenMeasurements } from '@/features/open-work/utils/group-open-measurements';

function item(number: string, status: MeasurementListItem['status'], updatedAt: string): MeasurementListItem {
  return {
    id: number,
    number,
    method: 'finite-conjugate',
    status,
    lens: { id: 'l', identifier: 'L-1' },
    workOrder: { id: 'w', number: 'WO-2026-0001' },
    performedBy: null,
    updatedAt,
    focalLengthMm: null,
    expandedUncertaintyMm: null,
  };
}

describe('groupOpenMeasurements', () => {
  it('groupOpenMeasurements puts returned and failed work first, newest first within a group, and drops empty groups', () => {
    const groups = groupOpenMeasurements([
      item('M-3', 'draft', '2026-03-01T10:00:00Z'),
      item('M-1', 'submitted', '2026-03-02T10:00:00Z'),
      item('M-4', 'draft', '2026-03-03T10:00:00Z'),
      item('M-2', 'returned', '2026-02-01T10:00:00Z'),
      item('M-9', 'certified', '2026-03-04T10:00:00Z'),
    ]);
    expect(groups.map((g) => [g.status, g.items.map((i) => i.number)])).toEqual([
      ['returned', ['M-2']],
      ['draft', ['M-4', 'M-3']],
      ['submitted', ['M-1']],
    ]);
  });
});
