/**
 * What each method needs on the bench, as the manifest contract states it
 * (measurement-manifest.md, "What each method needs and yields"): which
 * equipment, which part moves, which fixed rail readings each sweep needs,
 * and how many sweeps.
 */
import type { MeasurementMethod } from '@shared/measure/types';
import { equipmentFields, type EquipmentField, type EquipmentRole, type SweepMoving } from '@shared/schemas/measurements';

export type SweepReadingField = 'objectPositionMm' | 'lensPositionMm' | 'sensorPositionMm';

/** The request field that names the item used in each role. */
export const EQUIPMENT_FIELD_BY_ROLE = Object.fromEntries(equipmentFields.map(({ role, field }) => [role, field])) as Record<
  EquipmentRole,
  EquipmentField
>;

export const EQUIPMENT_ROLE_WORDS: Record<EquipmentRole, string> = {
  camera: 'Camera',
  target: 'Target',
  'rail-scale': 'Rail scale',
  collimator: 'Collimator',
  'auxiliary-lens': 'Auxiliary lens',
};

export const SWEEP_READING_WORDS: Record<SweepReadingField, string> = {
  objectPositionMm: 'Target (object) position',
  lensPositionMm: 'Lens mark position',
  sensorPositionMm: 'Sensor position',
};

export interface MethodRequirements {
  method: MeasurementMethod;
  /** The method's name as shown to people. */
  name: string;
  /** One plain sentence: what is set up and what moves. */
  explanation: string;
  equipmentRoles: EquipmentRole[];
  moving: SweepMoving;
  minimumSweeps: number;
  /** The fixed rail readings each sweep needs (the moving part's readings are the frames' readings). */
  sweepReadings: SweepReadingField[];
  /** Only sensible for this kind of lens; null when any lens will do. */
  lensKind: 'diverging' | null;
}

const BASIC_EQUIPMENT: EquipmentRole[] = ['camera', 'target', 'rail-scale'];

const REQUIREMENTS: Record<MeasurementMethod, MethodRequirements> = {
  'finite-conjugate': {
    method: 'finite-conjugate',
    name: 'Finite conjugate',
    explanation:
      'Target and lens stand still at known rail readings while the sensor moves through focus; f comes from the lens equation and the magnification together.',
    equipmentRoles: BASIC_EQUIPMENT,
    moving: 'sensor',
    minimumSweeps: 1,
    sweepReadings: ['objectPositionMm', 'lensPositionMm'],
    lensKind: null,
  },
  'multi-conjugate': {
    method: 'multi-conjugate',
    name: 'Multi-conjugate (thick lens)',
    explanation:
      'Two or more sensor sweeps with the target at different distances; gives f and where the principal planes sit, for thick or cemented lenses.',
    equipmentRoles: BASIC_EQUIPMENT,
    moving: 'sensor',
    minimumSweeps: 2,
    sweepReadings: ['objectPositionMm', 'lensPositionMm'],
    lensKind: null,
  },
  displacement: {
    method: 'displacement',
    name: 'Displacement (Bessel)',
    explanation:
      'Target and sensor stand more than 4 f apart and the lens moves; it is sharp at two places, and f follows from their separation.',
    equipmentRoles: BASIC_EQUIPMENT,
    moving: 'lens',
    minimumSweeps: 1,
    sweepReadings: ['objectPositionMm', 'sensorPositionMm'],
    lensKind: null,
  },
  collimator: {
    method: 'collimator',
    name: 'Collimator',
    explanation:
      'The target sits at the focal plane of a collimator, so it is at infinity; the sensor moves, and f comes from the image size and the collimator’s focal length.',
    equipmentRoles: [...BASIC_EQUIPMENT, 'collimator'],
    moving: 'sensor',
    minimumSweeps: 1,
    sweepReadings: ['lensPositionMm'],
    lensKind: null,
  },
  'auxiliary-lens': {
    method: 'auxiliary-lens',
    name: 'Auxiliary lens (diverging lenses)',
    explanation:
      'A diverging lens forms no real image, so it is measured in contact with a known converging lens and the known lens’s power is taken back out.',
    equipmentRoles: [...BASIC_EQUIPMENT, 'auxiliary-lens'],
    moving: 'sensor',
    minimumSweeps: 1,
    sweepReadings: ['objectPositionMm', 'lensPositionMm'],
    lensKind: 'diverging',
  },
};

/** In the order the choice is offered: the everyday method first, the special cases after. */
export const METHODS_IN_OFFER_ORDER: MeasurementMethod[] = [
  'finite-conjugate',
  'multi-conjugate',
  'displacement',
  'collimator',
  'auxiliary-lens',
];

export function methodRequirements(method: MeasurementMethod): MethodRequirements {
  const requirements = REQUIREMENTS[method];
  if (!requirements) throw new Error(`Invariant failed: no requirements for method ${JSON.stringify(method)}`);
  return requirements;
}

/** The method a lens most likely needs: a diverging lens cannot form a real image on its own. */
export function suggestedMethodFor(lensKind: 'converging' | 'diverging'): MeasurementMethod {
  return lensKind === 'diverging' ? 'auxiliary-lens' : 'finite-conjugate';
}
