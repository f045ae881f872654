/**
 * Measurements and sweeps as the API takes and returns them
 * (docs/api-bench.md, "Measurements, sweeps, frames"), and the rules a
 * measurement's set-up must meet for its method. The method rules come from
 * the engine's manifest contract (measurement-manifest.ts), so the set-up
 * form, the server and the engine cannot disagree. No Node APIs here.
 */
import { z } from 'zod';
import type { AnalysisRun, AnalysisRunSummary, PersonReference } from './analyses';
import type { CertificateSummary } from './certificates';
import type { MeasurementReviewState } from './review';
import type { EquipmentItem, EquipmentKindName } from './equipment';
import type { Frame } from './frames';
import { lensMeasurementStatuses, type LensKind } from './lenses';
import { checkMeasurementManifest, focusOperators, measurementMethods, type MeasurementManifestInput } from './measurement-manifest';
import { isoDateField, optionalText, pageField, pageSizeField, searchTextField, sortOrders, uuidField, type DecisionRule, type SortOrder } from './work-orders';

export type MeasurementMethodName = (typeof measurementMethods)[number];
export type FocusOperatorName = (typeof focusOperators)[number];

/* Kept equal to the database enum in server/db/schema.ts (a test checks it). */
export const measurementStatuses = lensMeasurementStatuses;
export type MeasurementStatus = (typeof measurementStatuses)[number];

/** Frames, sweeps and readings change only in these states (not while analysing, not once submitted). */
export const frameEditableStatuses = ['draft', 'analysed', 'analysis-failed', 'returned'] as const satisfies readonly MeasurementStatus[];
/** Environment, notes, focus operator and date change until the measurement is submitted. */
export const setupEditableStatuses = [...frameEditableStatuses, 'analysing'] as const satisfies readonly MeasurementStatus[];

export function canChangeFrames(status: MeasurementStatus): boolean {
  return (frameEditableStatuses as readonly string[]).includes(status);
}
export function canEditSetup(status: MeasurementStatus): boolean {
  return (setupEditableStatuses as readonly string[]).includes(status);
}

export const sweepMovings = ['sensor', 'lens'] as const;
export type SweepMoving = (typeof sweepMovings)[number];

export const equipmentRoles = ['camera', 'target', 'rail-scale', 'collimator', 'auxiliary-lens'] as const;
export type EquipmentRole = (typeof equipmentRoles)[number];

/** The body field naming each piece of equipment, and the kind it must be. */
export const equipmentFields = [
  { role: 'camera', field: 'cameraId', kind: 'camera' },
  { role: 'target', field: 'targetId', kind: 'target' },
  { role: 'rail-scale', field: 'railScaleId', kind: 'rail-scale' },
  { role: 'collimator', field: 'collimatorId', kind: 'collimator' },
  { role: 'auxiliary-lens', field: 'auxiliaryLensId', kind: 'auxiliary-lens' },
] as const satisfies readonly { role: EquipmentRole; field: string; kind: EquipmentKindName }[];
export type EquipmentField = (typeof equipmentFields)[number]['field'];

export const equipmentKindNames: Record<EquipmentKindName, string> = {
  camera: 'camera',
  target: 'target',
  'rail-scale': 'rail scale',
  collimator: 'collimator',
  'auxiliary-lens': 'auxiliary lens',
};

/* ------------------------------ set-up rules ------------------------------ */

export interface SweepSetup {
  moving: SweepMoving;
  objectPositionMm?: number | null;
  lensPositionMm?: number | null;
  sensorPositionMm?: number | null;
}

export interface MeasurementSetup {
  method: MeasurementMethodName;
  collimatorId?: string | null;
  auxiliaryLensId?: string | null;
  sweeps: readonly SweepSetup[];
}

export interface SetupProblem {
  /** Path of the field in the create body, e.g. ['sweeps', 0, 'lensPositionMm']. */
  path: (string | number)[];
  message: string;
}

/* Stand-ins for what the set-up does not know yet; only the method rules of the manifest are read. */
const PLACEHOLDER_FRAMES = Array.from({ length: 5 }, (_, i) => ({ file: `placeholder-${i}.png`, positionMm: i }));

function manifestPathToSetupPath(where: string): (string | number)[] {
  if (where === 'collimator') return ['collimatorId'];
  if (where === 'auxiliaryLens') return ['auxiliaryLensId'];
  return where
    .replace(/\[(\d+)\]/g, '.$1')
    .split('.')
    .filter(Boolean)
    .map((part) => (/^\d+$/.test(part) ? Number(part) : part));
}

function setupMessage(path: (string | number)[], manifestMessage: string, method: MeasurementMethodName): string {
  if (path[0] === 'collimatorId') return `Field "collimatorId" is required for the collimator method: choose the collimator used.`;
  if (path[0] === 'auxiliaryLensId') return `Field "auxiliaryLensId" is required for the auxiliary-lens method: choose the auxiliary lens used.`;
  if (path[0] === 'sweeps' && typeof path[1] === 'number') return `Sweep ${path[1] + 1}: ${manifestMessage}.`;
  if (path[0] === 'sweeps') return `${manifestMessage.charAt(0).toUpperCase()}${manifestMessage.slice(1)}.`;
  return `${manifestMessage} (${method}).`;
}

const near = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));

/**
 * What a measurement's set-up lacks for its method: the manifest contract's
 * rules (which part moves, which positions each sweep needs, sweeps per
 * method, collimator or auxiliary lens), plus the bench order (positions grow
 * from object to sensor), distinct object distances for multi-conjugate,
 * D > 4f for displacement and an auxiliary lens for a diverging lens when the
 * nominal focal length is known. Empty when the set-up is complete.
 */
export function measurementSetupProblems(setup: MeasurementSetup, lens?: { nominalFocalLengthMm: number }): SetupProblem[] {
  const problems: SetupProblem[] = [];
  const seen = new Set<string>();
  const add = (path: (string | number)[], message: string) => {
    const key = path.join('.');
    if (seen.has(key)) return;
    seen.add(key);
    problems.push({ path, message });
  };

  const manifest: MeasurementManifestInput = {
    method: setup.method,
    camera: { pixelPitchUm: 1 },
    target: { pattern: 'dot-pair', sizeMm: 1 },
    collimator: setup.collimatorId ? { focalLengthMm: 1 } : undefined,
    auxiliaryLens: setup.auxiliaryLensId ? { focalLengthMm: 1 } : undefined,
    sweeps: setup.sweeps.map((sweep) => ({
      moving: sweep.moving,
      objectPositionMm: sweep.objectPositionMm ?? undefined,
      lensPositionMm: sweep.lensPositionMm ?? undefined,
      sensorPositionMm: sweep.sensorPositionMm ?? undefined,
      frames: PLACEHOLDER_FRAMES,
    })),
  };
  const check = checkMeasurementManifest(manifest);
  if (!check.ok) {
    for (const [where, message] of Object.entries(check.fields)) {
      const path = manifestPathToSetupPath(where);
      add(path, setupMessage(path, message, setup.method));
    }
  }

  if (setup.collimatorId && setup.method !== 'collimator') {
    add(['collimatorId'], `Field "collimatorId" is only used by the collimator method; leave it out for ${setup.method}.`);
  }
  if (setup.auxiliaryLensId && setup.method !== 'auxiliary-lens') {
    add(['auxiliaryLensId'], `Field "auxiliaryLensId" is only used by the auxiliary-lens method; leave it out for ${setup.method}.`);
  }

  setup.sweeps.forEach((sweep, i) => {
    const object = sweep.objectPositionMm ?? null;
    if (sweep.moving === 'sensor' && object !== null && sweep.lensPositionMm != null && !(sweep.lensPositionMm > object)) {
      add(
        ['sweeps', i, 'lensPositionMm'],
        `Sweep ${i + 1}: the lens (${sweep.lensPositionMm} mm) must sit after the object (${object} mm); rail readings grow from object to sensor.`,
      );
    }
    if (sweep.moving === 'lens' && object !== null && sweep.sensorPositionMm != null && !(sweep.sensorPositionMm > object)) {
      add(
        ['sweeps', i, 'sensorPositionMm'],
        `Sweep ${i + 1}: the sensor (${sweep.sensorPositionMm} mm) must sit after the object (${object} mm); rail readings grow from object to sensor.`,
      );
    }
  });

  if (setup.method === 'multi-conjugate') {
    const distances: number[] = [];
    setup.sweeps.forEach((sweep, i) => {
      if (sweep.objectPositionMm == null || sweep.lensPositionMm == null) return;
      const distance = sweep.lensPositionMm - sweep.objectPositionMm;
      const same = distances.findIndex((d) => near(d, distance));
      if (same >= 0) {
        add(
          ['sweeps', i, 'objectPositionMm'],
          `Sweep ${i + 1} has the same object distance (${distance} mm) as sweep ${same + 1}; the multi-conjugate method needs different object distances.`,
        );
      }
      distances.push(distance);
    });
  }

  if (lens) {
    const f = lens.nominalFocalLengthMm;
    if (f < 0 && setup.method !== 'auxiliary-lens') {
      add(
        ['method'],
        `The lens is diverging (nominal ${f} mm) and forms no real image on its own; measure it with the auxiliary-lens method.`,
      );
    }
    if (setup.method === 'displacement') {
      setup.sweeps.forEach((sweep, i) => {
        if (sweep.objectPositionMm == null || sweep.sensorPositionMm == null) return;
        const distanceMm = sweep.sensorPositionMm - sweep.objectPositionMm;
        if (distanceMm > 0 && !(distanceMm > 4 * Math.abs(f))) {
          add(
            ['sweeps', i, 'sensorPositionMm'],
            `Sweep ${i + 1}: the object–sensor distance (${distanceMm} mm) must exceed 4 × the nominal focal length (${4 * Math.abs(f)} mm) for the displacement method.`,
          );
        }
      });
    }
  }
  return problems;
}

/* -------------------------------- requests -------------------------------- */

const positionField = (field: string) =>
  z
    .number({ error: `Field "${field}" must be a rail reading in mm (a number).` })
    .refine(Number.isFinite, { error: `Field "${field}" must be a finite number (mm).` })
    .nullable()
    .optional();

export const sweepSetupBody = z.strictObject({
  moving: z.enum(sweepMovings, { error: 'Field "moving" must be "sensor" or "lens".' }),
  objectPositionMm: positionField('objectPositionMm'),
  lensPositionMm: positionField('lensPositionMm'),
  sensorPositionMm: positionField('sensorPositionMm'),
});
export type SweepSetupBody = z.input<typeof sweepSetupBody>;

export const MEASUREMENT_MAX_SWEEPS = 20;

const environmentFields = {
  temperatureC: z
    .number({ error: 'Field "temperatureC" must be a number (°C).' })
    .min(-40, { error: 'Field "temperatureC" must be at least −40 °C.' })
    .max(80, { error: 'Field "temperatureC" must be at most 80 °C.' })
    .nullable()
    .optional(),
  relativeHumidityPercent: z
    .number({ error: 'Field "relativeHumidityPercent" must be a number (%).' })
    .min(0, { error: 'Field "relativeHumidityPercent" must be from 0 % to 100 %.' })
    .max(100, { error: 'Field "relativeHumidityPercent" must be from 0 % to 100 %.' })
    .nullable()
    .optional(),
  measuredOn: isoDateField('measuredOn').nullable().optional(),
  focusOperator: z.enum(focusOperators, { error: `Field "focusOperator" must be one of: ${focusOperators.join(', ')}.` }).optional(),
  notes: optionalText('notes', 5000).optional(),
};

export const equipmentOverrideBody = z.strictObject({
  equipmentId: uuidField('equipmentId'),
  reason: z
    .string({ error: 'An override needs a "reason" (text).' })
    .trim()
    .min(1, { error: 'An override needs a reason: say why this equipment may be used past its calibration due date.' })
    .max(1000, { error: 'An override reason must be at most 1000 characters long.' }),
});

export const createMeasurementBody = z
  .strictObject({
    lensId: uuidField('lensId'),
    method: z.enum(measurementMethods, { error: `Field "method" must be one of: ${measurementMethods.join(', ')}.` }),
    cameraId: uuidField('cameraId'),
    targetId: uuidField('targetId'),
    railScaleId: uuidField('railScaleId'),
    collimatorId: uuidField('collimatorId').nullable().optional(),
    auxiliaryLensId: uuidField('auxiliaryLensId').nullable().optional(),
    overrides: z.array(equipmentOverrideBody, { error: 'Field "overrides" must be a list of { equipmentId, reason }.' }).max(5).default([]),
    ...environmentFields,
    sweeps: z
      .array(sweepSetupBody, { error: 'Field "sweeps" must be a list of sweeps.' })
      .min(1, { error: 'Field "sweeps" must hold at least one sweep.' })
      .max(MEASUREMENT_MAX_SWEEPS, { error: `Field "sweeps" must hold at most ${MEASUREMENT_MAX_SWEEPS} sweeps.` }),
  })
  .superRefine((body, context) => {
    for (const problem of measurementSetupProblems(body)) context.addIssue({ code: 'custom', path: problem.path, message: problem.message });
  });
export type CreateMeasurementBody = z.input<typeof createMeasurementBody>;
export type CreateMeasurementInput = z.output<typeof createMeasurementBody>;

export const updateMeasurementBody = z.strictObject(environmentFields).refine((body) => Object.values(body).some((v) => v !== undefined), {
  error: 'Send at least one of the fields temperatureC, relativeHumidityPercent, measuredOn, focusOperator, notes.',
});
export type UpdateMeasurementBody = z.input<typeof updateMeasurementBody>;
export type UpdateMeasurementInput = z.output<typeof updateMeasurementBody>;

export const createSweepBody = sweepSetupBody;
export type CreateSweepBody = SweepSetupBody;

export const updateSweepBody = z
  .strictObject({
    objectPositionMm: positionField('objectPositionMm'),
    lensPositionMm: positionField('lensPositionMm'),
    sensorPositionMm: positionField('sensorPositionMm'),
  })
  .refine((body) => Object.values(body).some((v) => v !== undefined), {
    error: 'Send at least one of the fields objectPositionMm, lensPositionMm, sensorPositionMm.',
  });
export type UpdateSweepBody = z.input<typeof updateSweepBody>;

export const measurementIdParams = z.object({ measurementId: uuidField('measurementId') });
export const sweepIdParams = z.object({ sweepId: uuidField('sweepId') });

export const measurementSortFields = ['number', 'updatedAt', 'createdAt', 'status'] as const;
export type MeasurementSortField = (typeof measurementSortFields)[number];
export const MEASUREMENT_PAGE_SIZE_DEFAULT = 25;
export const MEASUREMENT_PAGE_SIZE_MAX = 100;

/** `status` takes one status or several separated by commas; `mine=true` keeps the caller's own; `q` searches number and lens identifier. */
export const listMeasurementsQuery = z.strictObject({
  q: searchTextField(),
  status: z
    .string({ error: 'Field "status" must be text.' })
    .transform((value, context) => {
      const parts = value.split(',').map((part) => part.trim()).filter(Boolean);
      if (parts.some((part) => !(measurementStatuses as readonly string[]).includes(part))) {
        context.addIssue({ code: 'custom', message: `Field "status" must be one or more of: ${measurementStatuses.join(', ')} (comma-separated).` });
        return z.NEVER;
      }
      return parts as MeasurementStatus[];
    })
    .optional(),
  mine: z
    .enum(['true', 'false'], { error: 'Field "mine" must be true or false.' })
    .transform((value) => value === 'true')
    .optional(),
  lensId: uuidField('lensId').optional(),
  sort: z.enum(measurementSortFields, { error: `Field "sort" must be one of: ${measurementSortFields.join(', ')}.` }).optional(),
  order: z.enum(sortOrders, { error: 'Field "order" must be "asc" or "desc".' }).optional(),
  page: pageField(),
  pageSize: pageSizeField(MEASUREMENT_PAGE_SIZE_MAX, MEASUREMENT_PAGE_SIZE_DEFAULT),
});
export type ListMeasurementsQuery = z.output<typeof listMeasurementsQuery>;
/** What the client puts in the query string. */
export type ListMeasurementsParams = Partial<{
  q: string;
  status: string;
  mine: boolean;
  lensId: string;
  sort: MeasurementSortField;
  order: SortOrder;
  page: number;
  pageSize: number;
}>;

/* -------------------------------- responses ------------------------------- */

export interface MeasurementListItem {
  id: string;
  number: string;
  method: MeasurementMethodName;
  status: MeasurementStatus;
  lens: { id: string; identifier: string };
  workOrder: { id: string; number: string };
  performedBy: PersonReference | null;
  /** ISO 8601 instant. */
  updatedAt: string;
  /** From the current analysis; null until one has succeeded. */
  focalLengthMm: number | null;
  expandedUncertaintyMm: number | null;
}

export interface MeasurementListResponse {
  items: MeasurementListItem[];
  total: number;
  page: number;
  pageSize: number;
}

export interface MeasurementEquipment extends EquipmentItem {
  role: EquipmentRole;
}

/** Equipment used past its calibration due date, with the reason given and who gave it. */
export interface EquipmentOverrideRecord {
  equipmentId: string;
  /** The equipment's identifier, e.g. CAM-B2 (null if the item was since removed). */
  identifier: string | null;
  role: EquipmentRole | null;
  reason: string;
  recordedBy: PersonReference | null;
  /** ISO 8601 instant. */
  recordedAt: string;
}

export interface SweepDetail {
  id: string;
  /** 0-based order within the measurement. */
  position: number;
  moving: SweepMoving;
  objectPositionMm: number | null;
  lensPositionMm: number | null;
  sensorPositionMm: number | null;
  /** In natural file-name order. */
  frames: Frame[];
}

export interface MeasurementLens {
  id: string;
  identifier: string;
  description: string;
  partNumber: string | null;
  nominalFocalLengthMm: number;
  tolerancePercent: number | null;
  toleranceMm: number | null;
  kind: LensKind;
}

export interface MeasurementWorkOrder {
  id: string;
  number: string;
  title: string;
  decisionRule: DecisionRule;
  organisation: { id: string; name: string };
}

export interface MeasurementDetail {
  id: string;
  number: string;
  method: MeasurementMethodName;
  status: MeasurementStatus;
  lens: MeasurementLens;
  workOrder: MeasurementWorkOrder;
  equipment: MeasurementEquipment[];
  overrides: EquipmentOverrideRecord[];
  temperatureC: number | null;
  relativeHumidityPercent: number | null;
  /** YYYY-MM-DD or null. */
  measuredOn: string | null;
  focusOperator: FocusOperatorName;
  notes: string | null;
  performedBy: PersonReference | null;
  /** ISO 8601 instants. */
  createdAt: string;
  updatedAt: string;
  sweeps: SweepDetail[];
  /** The run shown (the latest succeeded one, or the one under review); null before any has succeeded. */
  currentAnalysis: AnalysisRun | null;
  /** Every run, newest first. */
  analyses: AnalysisRunSummary[];
  /** Who submitted and approved it, and when (shared/schemas/review.ts). */
  review: MeasurementReviewState;
  /** Every certificate revision, newest first. */
  certificates: CertificateSummary[];
}

export interface MeasurementResponse {
  measurement: MeasurementDetail;
}

export interface SweepResponse {
  sweep: SweepDetail;
}
