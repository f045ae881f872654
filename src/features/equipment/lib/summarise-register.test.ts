import { describe, expect, it } from 'vitest';
import type { EquipmentItem } from '@shared/schemas/equipment';
import { filterRegister, summariseRegister } from '@/features/equipment/lib/summarise-register';

function item(overrides: Partial<EquipmentItem>): EquipmentItem {
  return {
    id: overrides.identifier ?? 'id',
    kind: 'camera',
    identifier: 'CAM',
    description: '',
    serialNumber: null,
    values: {},
    calibrationReference: 'Cert',
    calibrationDueDate: '2027-06-30',
    active: true,
    calibrationState: 'current',
    daysUntilCalibrationDue: 200,
    ...overrides,
  };
}

describe('summariseRegister', () => {
  const items = [
    item({ identifier: 'CAM-10', calibrationState: 'current' }),
    item({ identifier: 'CAM-2', calibrationState: 'overdue' }),
    item({ identifier: 'CAM-1', calibrationState: 'current' }),
    item({ identifier: 'CAM-0', calibrationState: 'overdue', active: false }),
    item({ identifier: 'RS-1', kind: 'rail-scale', calibrationState: 'due-soon', calibrationReference: 'Scale report 55' }),
  ];

  it('summariseRegister counts calibration states of items in service only', () => {
    const summary = summariseRegister(items);
    expect(summary.inService).toBe(4);
    expect(summary.retired).toBe(1);
    expect(summary.byState).toEqual({ current: 2, 'due-soon': 1, overdue: 1 });
  });

  it('each kind lists items in service first, the most urgent on top, then by identifier in number order', () => {
    expect(summariseRegister(items).byKind.camera.map((entry) => entry.identifier)).toEqual(['CAM-2', 'CAM-1', 'CAM-10', 'CAM-0']);
    expect(summariseRegister(items).byKind.target).toEqual([]);
  });

  it('filterRegister finds by identifier, serial or calibration reference, ignoring case', () => {
    expect(filterRegister(items, 'scale REPORT').map((entry) => entry.identifier)).toEqual(['RS-1']);
    expect(filterRegister(items, ' ')).toHaveLength(items.length);
  });
});
