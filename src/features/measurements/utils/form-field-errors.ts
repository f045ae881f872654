/**
 * Places the server's per-field sentences beside the form's fields. The
 * server names fields by their request path (`sweeps[1].lensPositionMm`,
 * `sweeps.1.lensPositionMm`, `overrides.0.reason`, `cameraId`); the form keys
 * them the same way except that an override is keyed by its equipment role.
 */
import type { CreateMeasurementBody, EquipmentRole } from '@shared/schemas/measurements';
import { overrideFieldKey } from '@/features/measurements/utils/build-create-measurement-request';
import { EQUIPMENT_FIELD_BY_ROLE } from '@/features/measurements/utils/method-requirements';

/** `a[0].b` and `a.0.b` and `a/0/b` all become `a.0.b`. */
export function normaliseFieldPath(path: string): string {
  return path
    .replace(/\[(\d+)\]/g, '.$1')
    .replace(/\//g, '.')
    .replace(/^\./, '');
}

export interface PlacedFieldErrors {
  /** By form field key. */
  fields: Record<string, string>;
  /** Sentences for fields the form does not show, to list above it. */
  unplaced: string[];
}

export function placeServerFieldErrors(
  serverFields: Record<string, string>,
  request: CreateMeasurementBody,
  shownFieldKeys: ReadonlySet<string>,
): PlacedFieldErrors {
  const fields: Record<string, string> = {};
  const unplaced: string[] = [];
  const roleByEquipmentId = new Map<string, EquipmentRole>();
  for (const [role, field] of Object.entries(EQUIPMENT_FIELD_BY_ROLE) as [EquipmentRole, keyof CreateMeasurementBody][]) {
    const id = request[field];
    if (typeof id === 'string' && id) roleByEquipmentId.set(id, role);
  }

  for (const [rawPath, sentence] of Object.entries(serverFields)) {
    let key = normaliseFieldPath(rawPath);
    const override = /^overrides\.(\d+)(\.|$)/.exec(key);
    if (override) {
      const equipmentId = request.overrides?.[Number(override[1])]?.equipmentId;
      const role = equipmentId ? roleByEquipmentId.get(equipmentId) : undefined;
      if (role) key = overrideFieldKey(role);
    }
    if (shownFieldKeys.has(key)) fields[key] = fields[key] ? `${fields[key]} ${sentence}` : sentence;
    else unplaced.push(sentence);
  }
  return { fields, unplaced };
}
