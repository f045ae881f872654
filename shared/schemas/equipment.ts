/**
 * The equipment register as the API takes and returns it
 * (docs/api-bench.md, "Equipment register"). All uncertainties are standard
 * uncertainties (k = 1). Shared by the server's validators and the client.
 */
import { z } from 'zod';
import { isoDateField, optionalText, searchTextField, trimmedText, uuidField } from './work-orders';

/* Kept equal to the database enum in server/db/schema.ts (a test checks it). */
export const equipmentKinds = ['camera', 'target', 'rail-scale', 'collimator', 'auxiliary-lens'] as const;
export type EquipmentKindName = (typeof equipmentKinds)[number];

export const calibrationStates = ['current', 'due-soon', 'overdue'] as const;
export type CalibrationState = (typeof calibrationStates)[number];
/** A calibration due within this many days (today included) is "due-soon". */
export const CALIBRATION_DUE_SOON_DAYS = 30;

const valueField = (name: string) => `Field "values.${name}"`;

function positiveValue(name: string, unit: string) {
  return z
    .number({ error: `${valueField(name)} must be a number (${unit}).` })
    .gt(0, { error: `${valueField(name)} must be greater than 0 ${unit}.` });
}
function nonNegativeValue(name: string, unit: string) {
  return z
    .number({ error: `${valueField(name)} must be a number (${unit}).` })
    .min(0, { error: `${valueField(name)} must be 0 ${unit} or more.` });
}
function pixelCount(name: string) {
  return z
    .number({ error: `${valueField(name)} must be a whole number of pixels.` })
    .int({ error: `${valueField(name)} must be a whole number of pixels.` })
    .min(1, { error: `${valueField(name)} must be at least 1 px.` });
}
const unexpected = (kind: string) => ({
  error: (issue: { code?: string; keys?: string[] }) =>
    issue.code === 'unrecognized_keys' && issue.keys
      ? `Field "values" has field(s) that a ${kind} does not take: ${issue.keys.join(', ')}.`
      : 'Field "values" must be an object of the values this kind of equipment carries.',
});

export const cameraValues = z.strictObject(
  {
    pixelPitchUm: positiveValue('pixelPitchUm', 'µm'),
    pixelPitchUncertaintyUm: nonNegativeValue('pixelPitchUncertaintyUm', 'µm'),
    widthPx: pixelCount('widthPx').optional(),
    heightPx: pixelCount('heightPx').optional(),
  },
  unexpected('camera'),
);
export type CameraValues = z.output<typeof cameraValues>;

export const targetValues = z.strictObject(
  {
    pattern: z.enum(['dot-pair', 'square'], { error: `${valueField('pattern')} must be "dot-pair" or "square".` }),
    sizeMm: positiveValue('sizeMm', 'mm'),
    sizeUncertaintyMm: nonNegativeValue('sizeUncertaintyMm', 'mm'),
    polarity: z
      .enum(['dark-on-light', 'light-on-dark'], { error: `${valueField('polarity')} must be "dark-on-light" or "light-on-dark".` })
      .optional(),
  },
  unexpected('target'),
);
export type TargetValues = z.output<typeof targetValues>;

export const railScaleValues = z.strictObject(
  {
    uncertaintyMm: nonNegativeValue('uncertaintyMm', 'mm'),
    lengthMm: positiveValue('lengthMm', 'mm').optional(),
  },
  unexpected('rail scale'),
);
export type RailScaleValues = z.output<typeof railScaleValues>;

/** A collimator or an auxiliary lens: a reference focal length and its uncertainty. */
export const referenceLensValues = z.strictObject(
  {
    focalLengthMm: positiveValue('focalLengthMm', 'mm'),
    focalLengthUncertaintyMm: nonNegativeValue('focalLengthUncertaintyMm', 'mm'),
  },
  unexpected('collimator or auxiliary lens'),
);
export type ReferenceLensValues = z.output<typeof referenceLensValues>;

/** The `values` schema of each kind of equipment. */
export const equipmentValuesByKind = {
  camera: cameraValues,
  target: targetValues,
  'rail-scale': railScaleValues,
  collimator: referenceLensValues,
  'auxiliary-lens': referenceLensValues,
} as const satisfies Record<EquipmentKindName, z.ZodType>;

export type EquipmentValuesOf<K extends EquipmentKindName> = z.output<(typeof equipmentValuesByKind)[K]>;

const valuesObject = <T extends z.ZodType>(schema: T) =>
  z.custom<unknown>((value) => typeof value === 'object' && value !== null && !Array.isArray(value), {
    error: 'Field "values" must be an object of the values this kind of equipment carries.',
  }).pipe(schema);

const commonEquipmentFields = {
  identifier: trimmedText('identifier', 60),
  description: z
    .string({ error: 'Field "description" must be text.' })
    .trim()
    .max(1000, { error: 'Field "description" must be at most 1000 characters long.' })
    .optional(),
  serialNumber: optionalText('serialNumber', 100).optional(),
  calibrationReference: trimmedText('calibrationReference', 200),
  calibrationDueDate: isoDateField('calibrationDueDate'),
};

export const createEquipmentBody = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('camera'), values: valuesObject(cameraValues), ...commonEquipmentFields }),
    z.strictObject({ kind: z.literal('target'), values: valuesObject(targetValues), ...commonEquipmentFields }),
    z.strictObject({ kind: z.literal('rail-scale'), values: valuesObject(railScaleValues), ...commonEquipmentFields }),
    z.strictObject({ kind: z.literal('collimator'), values: valuesObject(referenceLensValues), ...commonEquipmentFields }),
    z.strictObject({ kind: z.literal('auxiliary-lens'), values: valuesObject(referenceLensValues), ...commonEquipmentFields }),
  ],
  { error: `Field "kind" must be one of: ${equipmentKinds.join(', ')}.` },
);
export type CreateEquipmentBody = z.input<typeof createEquipmentBody>;
export type CreateEquipmentInput = z.output<typeof createEquipmentBody>;

/**
 * Any field. `values` replaces the whole set and is checked against the
 * stored kind (which cannot change); `active: false` retires the item.
 */
export const updateEquipmentBody = z
  .strictObject({
    kind: z.enum(equipmentKinds, { error: `Field "kind" must be one of: ${equipmentKinds.join(', ')}.` }).optional(),
    identifier: commonEquipmentFields.identifier.optional(),
    description: commonEquipmentFields.description,
    serialNumber: commonEquipmentFields.serialNumber,
    values: z
      .record(z.string(), z.unknown(), { error: 'Field "values" must be an object of the values this kind of equipment carries.' })
      .optional(),
    calibrationReference: commonEquipmentFields.calibrationReference.optional(),
    calibrationDueDate: commonEquipmentFields.calibrationDueDate.optional(),
    active: z.boolean({ error: 'Field "active" must be true or false.' }).optional(),
  })
  .refine((body) => Object.values(body).some((value) => value !== undefined), {
    error: 'Send at least one field to change.',
  });
export type UpdateEquipmentBody = z.input<typeof updateEquipmentBody>;
export type UpdateEquipmentInput = z.output<typeof updateEquipmentBody>;

export const listEquipmentQuery = z.strictObject({
  kind: z.enum(equipmentKinds, { error: `Field "kind" must be one of: ${equipmentKinds.join(', ')}.` }).optional(),
  q: searchTextField(),
  includeInactive: z
    .enum(['true', 'false'], { error: 'Field "includeInactive" must be true or false.' })
    .transform((value) => value === 'true')
    .optional(),
});
export type ListEquipmentQuery = z.output<typeof listEquipmentQuery>;

export const equipmentIdParams = z.object({ equipmentId: uuidField('equipmentId') });

export interface EquipmentItem {
  id: string;
  kind: EquipmentKindName;
  identifier: string;
  description: string;
  serialNumber: string | null;
  values: Record<string, string | number | null>;
  calibrationReference: string;
  /** YYYY-MM-DD. */
  calibrationDueDate: string;
  active: boolean;
  calibrationState: CalibrationState;
  /** Whole days from today to the due date (negative once overdue). */
  daysUntilCalibrationDue: number;
}

export interface EquipmentListResponse {
  items: EquipmentItem[];
}
export interface EquipmentResponse {
  equipment: EquipmentItem;
}
