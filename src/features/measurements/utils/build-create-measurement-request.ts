/**
 * Turns the new-measurement form into the POST /api/measurements body, or
 * into sentences naming each field a person must fix before sending. The
 * server checks the same rules again; these only spare a round trip.
 */
import type { MeasurementMethod } from '@shared/measure/types';
import type { EquipmentItem } from '@shared/schemas/equipment';
import {
  MEASUREMENT_MAX_SWEEPS,
  measurementSetupProblems,
  type CreateMeasurementBody,
  type EquipmentRole,
  type SweepSetupBody,
} from '@shared/schemas/measurements';
import {
  EQUIPMENT_FIELD_BY_ROLE,
  EQUIPMENT_ROLE_WORDS,
  methodRequirements,
  SWEEP_READING_WORDS,
  type SweepReadingField,
} from '@/features/measurements/utils/method-requirements';
import { parseDecimal } from '@/features/measurements/utils/parse-decimal';

export const MAXIMUM_SWEEPS = MEASUREMENT_MAX_SWEEPS;
/* The server takes any non-empty reason; a few words at least make the recorded override mean something to a reviewer. */
const MINIMUM_OVERRIDE_REASON_LENGTH = 10;

export interface SweepDraft {
  objectPositionMm: string;
  lensPositionMm: string;
  sensorPositionMm: string;
}

export interface NewMeasurementDraft {
  method: MeasurementMethod;
  equipmentIds: Partial<Record<EquipmentRole, string>>;
  /** Why an overdue item is used anyway, by equipment id. */
  overrideReasons: Record<string, string>;
  temperatureC: string;
  relativeHumidityPercent: string;
  /** YYYY-MM-DD or empty. */
  measuredOn: string;
  notes: string;
  sweeps: SweepDraft[];
}

export const EMPTY_SWEEP_DRAFT: SweepDraft = { objectPositionMm: '', lensPositionMm: '', sensorPositionMm: '' };

export function emptyNewMeasurementDraft(method: MeasurementMethod): NewMeasurementDraft {
  return {
    method,
    equipmentIds: {},
    overrideReasons: {},
    temperatureC: '',
    relativeHumidityPercent: '',
    measuredOn: '',
    notes: '',
    sweeps: Array.from({ length: methodRequirements(method).minimumSweeps }, () => ({ ...EMPTY_SWEEP_DRAFT })),
  };
}

/** Fits the sweep list to a method's minimum, keeping what was typed: adds empty sweeps, and drops trailing ones only while they are empty. */
export function sweepsForMethod(sweeps: SweepDraft[], method: MeasurementMethod): SweepDraft[] {
  const minimum = methodRequirements(method).minimumSweeps;
  if (sweeps.length < minimum) return [...sweeps, ...Array.from({ length: minimum - sweeps.length }, () => ({ ...EMPTY_SWEEP_DRAFT }))];
  const isEmpty = (sweep: SweepDraft) => Object.values(sweep).every((text) => text.trim() === '');
  let kept = sweeps.length;
  while (kept > minimum && isEmpty(sweeps[kept - 1])) kept -= 1;
  return sweeps.slice(0, kept);
}

/** Field key of one sweep reading, the same as the server's dotted path: `sweeps.0.lensPositionMm`. */
export function sweepFieldKey(index: number, field: SweepReadingField): string {
  return `sweeps.${index}.${field}`;
}

/** Field key of an overdue item's override reason in the form. */
export function overrideFieldKey(role: EquipmentRole): string {
  return `override.${role}`;
}

export interface BuildCreateMeasurementRequestOptions {
  lensId: string;
  /** Signed nominal focal length of the lens, mm; for the displacement method's D > 4f check and the diverging-lens rule. */
  nominalFocalLengthMm: number;
  draft: NewMeasurementDraft;
  /** Every item the pickers offered, by id. */
  equipmentById: ReadonlyMap<string, EquipmentItem>;
}

export type CreateMeasurementRequestCheck =
  | { ok: true; request: CreateMeasurementBody }
  | { ok: false; fields: Record<string, string> };

const ORDINAL_SWEEP = (index: number) => `sweep ${index + 1}`;
const FIELD_PHRASE: Record<SweepReadingField, string> = {
  objectPositionMm: 'target position',
  lensPositionMm: 'lens mark position',
  sensorPositionMm: 'sensor position',
};

export function buildCreateMeasurementRequest(options: BuildCreateMeasurementRequestOptions): CreateMeasurementRequestCheck {
  const { lensId, nominalFocalLengthMm, draft, equipmentById } = options;
  const requirements = methodRequirements(draft.method);
  const fields: Record<string, string> = {};

  const request: CreateMeasurementBody = {
    lensId,
    method: draft.method,
    cameraId: '',
    targetId: '',
    railScaleId: '',
    sweeps: [],
  };
  const overrides: { equipmentId: string; reason: string }[] = [];

  for (const role of requirements.equipmentRoles) {
    const field = EQUIPMENT_FIELD_BY_ROLE[role];
    const id = draft.equipmentIds[role];
    const item = id ? equipmentById.get(id) : undefined;
    if (!id || !item) {
      fields[field] = `Choose the ${EQUIPMENT_ROLE_WORDS[role].toLowerCase()} used on the bench.`;
      continue;
    }
    if (item.kind !== role) {
      throw new Error(`Invariant failed: ${item.identifier} is a ${item.kind} offered for the ${role} role`);
    }
    request[field] = id;
    if (item.calibrationState === 'overdue') {
      const reason = (draft.overrideReasons[id] ?? '').trim();
      if (reason.length < MINIMUM_OVERRIDE_REASON_LENGTH) {
        fields[overrideFieldKey(role)] =
          `${item.identifier} was due for calibration on ${item.calibrationDueDate}; give the reason for using it anyway (at least a short sentence).`;
      } else {
        overrides.push({ equipmentId: id, reason });
      }
    }
  }
  if (overrides.length > 0) request.overrides = overrides;

  const temperatureC = parseDecimal(draft.temperatureC);
  if (temperatureC === null) fields.temperatureC = 'Temperature must be a number in °C, e.g. 21.5.';
  else if (temperatureC !== undefined) {
    if (temperatureC < -40 || temperatureC > 80) fields.temperatureC = 'Temperature must be between −40 °C and 80 °C.';
    else request.temperatureC = temperatureC;
  }
  const humidity = parseDecimal(draft.relativeHumidityPercent);
  if (humidity === null) fields.relativeHumidityPercent = 'Relative humidity must be a number in %, e.g. 45.';
  else if (humidity !== undefined) {
    if (humidity < 0 || humidity > 100) fields.relativeHumidityPercent = 'Relative humidity must be between 0 % and 100 %.';
    else request.relativeHumidityPercent = humidity;
  }
  if (draft.measuredOn.trim() !== '') {
    if (!/^\d{4}-\d{2}-\d{2}$/.test(draft.measuredOn.trim())) fields.measuredOn = 'Measured on must be a date, YYYY-MM-DD.';
    else request.measuredOn = draft.measuredOn.trim();
  }
  if (draft.notes.trim() !== '') request.notes = draft.notes.trim();

  if (draft.sweeps.length < requirements.minimumSweeps) {
    fields.sweeps = `The ${requirements.name} method needs at least ${requirements.minimumSweeps} sweeps.`;
  }
  if (draft.sweeps.length > MAXIMUM_SWEEPS) fields.sweeps = `A measurement holds at most ${MAXIMUM_SWEEPS} sweeps.`;

  draft.sweeps.forEach((sweepDraft, index) => {
    const sweep: SweepSetupBody = { moving: requirements.moving };
    for (const field of requirements.sweepReadings) {
      const value = parseDecimal(sweepDraft[field]);
      const key = sweepFieldKey(index, field);
      if (value === undefined) fields[key] = `Enter the ${FIELD_PHRASE[field]} of ${ORDINAL_SWEEP(index)}, in mm.`;
      else if (value === null) fields[key] = `The ${FIELD_PHRASE[field]} of ${ORDINAL_SWEEP(index)} must be a number in mm, e.g. 250.0.`;
      else sweep[field] = value;
    }
    request.sweeps.push(sweep);
  });

  // The method rules the server applies (shared with it): bench order, distinct distances, D > 4f, diverging lenses.
  const setupProblems = measurementSetupProblems(
    {
      method: draft.method,
      collimatorId: request.collimatorId,
      auxiliaryLensId: request.auxiliaryLensId,
      sweeps: request.sweeps,
    },
    { nominalFocalLengthMm },
  );
  for (const problem of setupProblems) {
    const key = problem.path.join('.');
    fields[key] ??= problem.message;
  }

  if (Object.keys(fields).length > 0) return { ok: false, fields };
  return { ok: true, request };
}

/** The fixed readings a sweep of this method shows, with their words. */
export function sweepReadingLabels(method: MeasurementMethod): { field: SweepReadingField; label: string }[] {
  return methodRequirements(method).sweepReadings.map((field) => ({ field, label: SWEEP_READING_WORDS[field] }));
}
