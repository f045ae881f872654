import type { CalibrationState, EquipmentItem, EquipmentKindName } from '@shared/schemas/equipment';
import { equipmentKinds } from '@shared/schemas/equipment';

export interface RegisterSummary {
  inService: number;
  retired: number;
  byState: Record<CalibrationState, number>;
  byKind: Record<EquipmentKindName, EquipmentItem[]>;
}

/** Retired items count apart: their calibration no longer matters to anyone. */
export function summariseRegister(items: readonly EquipmentItem[]): RegisterSummary {
  const byKind = Object.fromEntries(equipmentKinds.map((kind) => [kind, [] as EquipmentItem[]])) as Record<EquipmentKindName, EquipmentItem[]>;
  const byState: Record<CalibrationState, number> = { current: 0, 'due-soon': 0, overdue: 0 };
  let retired = 0;
  for (const item of items) {
    byKind[item.kind]?.push(item);
    if (item.active) byState[item.calibrationState] += 1;
    else retired += 1;
  }
  const urgency: Record<CalibrationState, number> = { overdue: 0, 'due-soon': 1, current: 2 };
  for (const kind of equipmentKinds) {
    // In service first, the most urgent calibration on top, then by identifier.
    byKind[kind].sort(
      (a, b) =>
        Number(b.active) - Number(a.active) ||
        urgency[a.calibrationState] - urgency[b.calibrationState] ||
        a.identifier.localeCompare(b.identifier, undefined, { numeric: true }),
    );
  }
  return { inService: items.length - retired, retired, byState, byKind };
}

export function filterRegister(items: readonly EquipmentItem[], query: string): EquipmentItem[] {
  const needle = query.trim().toLowerCase();
  if (needle === '') return [...items];
  return items.filter((item) =>
    [item.identifier, item.description, item.serialNumber ?? '', item.calibrationReference].join(' ').toLowerCase().includes(needle),
  );
}
