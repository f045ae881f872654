/**
 * Lenses (items under test) and the part-number spread as the API takes and
 * returns them (docs/api-bench.md, "Work orders" and "Lenses"). Shared by the
 * server's validators and the client; no Node APIs here.
 */
import { z } from 'zod';
import type { MeasurementMethod } from '../measure/types';
import type { ConformityResult } from './measurement-result';
import { optionalText, trimmedText, uuidField, type DecisionRule } from './work-orders';

/* Kept equal to the database enum in server/db/schema.ts (a test checks it). */
export const lensMeasurementStatuses = [
  'draft',
  'analysing',
  'analysed',
  'analysis-failed',
  'submitted',
  'approved',
  'returned',
  'certified',
] as const;
export type LensMeasurementStatus = (typeof lensMeasurementStatuses)[number];

export type ConformityDecision = ConformityResult['decision'];
export type LensKind = 'converging' | 'diverging';

/** Optical power in dioptres from a focal length in millimetres (P = 1000/f) and back. */
export function powerDioptresFromFocalLengthMm(focalLengthMm: number): number {
  return 1000 / focalLengthMm;
}
export function focalLengthMmFromPowerDioptres(powerDioptres: number): number {
  return 1000 / powerDioptres;
}

export function lensKindOf(nominalFocalLengthMm: number): LensKind {
  return nominalFocalLengthMm < 0 ? 'diverging' : 'converging';
}

/**
 * The tolerance band of a lens. When both a percentage and an absolute
 * tolerance are given, the tighter one applies: a lens must meet every limit
 * its specification states.
 */
export function toleranceBandOf(lens: {
  nominalFocalLengthMm: number;
  tolerancePercent: number | null;
  toleranceMm: number | null;
}): { lowerLimitMm: number; upperLimitMm: number; halfWidthMm: number } {
  const widths = [
    lens.tolerancePercent !== null ? (Math.abs(lens.nominalFocalLengthMm) * lens.tolerancePercent) / 100 : Infinity,
    lens.toleranceMm ?? Infinity,
  ];
  const halfWidthMm = Math.min(...widths);
  if (!Number.isFinite(halfWidthMm)) throw new Error('Invariant failed: a lens must carry a tolerance in percent or in millimetres.');
  return { lowerLimitMm: lens.nominalFocalLengthMm - halfWidthMm, upperLimitMm: lens.nominalFocalLengthMm + halfWidthMm, halfWidthMm };
}

const NOMINAL_MESSAGES = {
  both: 'Give either "nominalFocalLengthMm" or "nominalPowerDioptres", not both.',
  neither: 'Give the nominal focal length ("nominalFocalLengthMm", in mm) or the nominal power ("nominalPowerDioptres", in D).',
  tolerance: 'Give a tolerance: "tolerancePercent" (± % of the nominal focal length) or "toleranceMm" (± mm), or both.',
} as const;
export const LENS_FIELD_MESSAGES = NOMINAL_MESSAGES;

const nonZeroNumber = (field: string, unit: string) =>
  z
    .number({ error: `Field "${field}" must be a number (${unit}).` })
    .refine((value) => value !== 0, { error: `Field "${field}" must not be zero.` })
    .refine((value) => Math.abs(value) <= 1e6, { error: `Field "${field}" must be at most 1000000 ${unit} in size.` });

const tolerancePercentField = z
  .number({ error: 'Field "tolerancePercent" must be a number (%).' })
  .gt(0, { error: 'Field "tolerancePercent" must be greater than 0 %.' })
  .max(100, { error: 'Field "tolerancePercent" must be at most 100 %.' });

const toleranceMmField = z
  .number({ error: 'Field "toleranceMm" must be a number (mm).' })
  .gt(0, { error: 'Field "toleranceMm" must be greater than 0 mm.' })
  .max(1e6, { error: 'Field "toleranceMm" must be at most 1000000 mm.' });

const lensTextFields = {
  identifier: trimmedText('identifier', 100),
  description: z
    .string({ error: 'Field "description" must be text.' })
    .trim()
    .max(1000, { error: 'Field "description" must be at most 1000 characters long.' }),
  partNumber: optionalText('partNumber', 100),
};

export const createLensBody = z
  .strictObject({
    identifier: lensTextFields.identifier,
    description: lensTextFields.description.optional(),
    partNumber: lensTextFields.partNumber.optional(),
    nominalFocalLengthMm: nonZeroNumber('nominalFocalLengthMm', 'mm').optional(),
    nominalPowerDioptres: nonZeroNumber('nominalPowerDioptres', 'D').optional(),
    tolerancePercent: tolerancePercentField.optional(),
    toleranceMm: toleranceMmField.optional(),
  })
  .superRefine((body, context) => {
    const given = [body.nominalFocalLengthMm, body.nominalPowerDioptres].filter((value) => value !== undefined).length;
    if (given !== 1) {
      const message = given === 2 ? NOMINAL_MESSAGES.both : NOMINAL_MESSAGES.neither;
      context.addIssue({ code: 'custom', path: ['nominalFocalLengthMm'], message });
      context.addIssue({ code: 'custom', path: ['nominalPowerDioptres'], message });
    }
    if (body.tolerancePercent === undefined && body.toleranceMm === undefined) {
      context.addIssue({ code: 'custom', path: ['tolerancePercent'], message: NOMINAL_MESSAGES.tolerance });
      context.addIssue({ code: 'custom', path: ['toleranceMm'], message: NOMINAL_MESSAGES.tolerance });
    }
  });
export type CreateLensBody = z.input<typeof createLensBody>;
export type CreateLensInput = z.output<typeof createLensBody>;

/**
 * Any field of the create body. A new nominal value is given as one of the
 * two (not both); a tolerance may be cleared with null as long as the other
 * one remains (checked against the stored lens).
 */
export const updateLensBody = z
  .strictObject({
    identifier: lensTextFields.identifier.optional(),
    description: lensTextFields.description.optional(),
    partNumber: lensTextFields.partNumber.optional(),
    nominalFocalLengthMm: nonZeroNumber('nominalFocalLengthMm', 'mm').optional(),
    nominalPowerDioptres: nonZeroNumber('nominalPowerDioptres', 'D').optional(),
    tolerancePercent: tolerancePercentField.nullable().optional(),
    toleranceMm: toleranceMmField.nullable().optional(),
  })
  .superRefine((body, context) => {
    if (body.nominalFocalLengthMm !== undefined && body.nominalPowerDioptres !== undefined) {
      context.addIssue({ code: 'custom', path: ['nominalFocalLengthMm'], message: NOMINAL_MESSAGES.both });
      context.addIssue({ code: 'custom', path: ['nominalPowerDioptres'], message: NOMINAL_MESSAGES.both });
    }
    if (body.tolerancePercent === null && body.toleranceMm === null) {
      context.addIssue({ code: 'custom', path: ['tolerancePercent'], message: NOMINAL_MESSAGES.tolerance });
      context.addIssue({ code: 'custom', path: ['toleranceMm'], message: NOMINAL_MESSAGES.tolerance });
    }
    if (Object.values(body).every((value) => value === undefined)) {
      context.addIssue({
        code: 'custom',
        path: [],
        message:
          'Send at least one of the fields identifier, description, partNumber, nominalFocalLengthMm, nominalPowerDioptres, tolerancePercent, toleranceMm.',
      });
    }
  });
export type UpdateLensBody = z.input<typeof updateLensBody>;
export type UpdateLensInput = z.output<typeof updateLensBody>;

export const lensIdParams = z.object({ lensId: uuidField('lensId') });

export interface LatestLensMeasurement {
  id: string;
  number: string;
  status: LensMeasurementStatus;
  method: MeasurementMethod;
  /** From the measurement's current analysis; null until one has succeeded. */
  focalLengthMm: number | null;
  expandedUncertaintyMm: number | null;
  decision: ConformityDecision | null;
}

export interface LensSummary {
  id: string;
  identifier: string;
  description: string;
  partNumber: string | null;
  /** Signed: negative for a diverging lens. */
  nominalFocalLengthMm: number;
  /** 1000 / nominalFocalLengthMm. */
  nominalPowerDioptres: number;
  tolerancePercent: number | null;
  toleranceMm: number | null;
  kind: LensKind;
  latestMeasurement: LatestLensMeasurement | null;
}

export interface LensMeasurementHistoryItem {
  id: string;
  number: string;
  method: MeasurementMethod;
  status: LensMeasurementStatus;
  /** YYYY-MM-DD or null. */
  measuredOn: string | null;
  performedBy: { id: string; name: string } | null;
  /** Version of the current analysis run; null when none has succeeded. */
  analysisVersion: number | null;
  focalLengthMm: number | null;
  expandedUncertaintyMm: number | null;
  coverageFactor: number | null;
  decision: ConformityDecision | null;
}

export interface LensDetail extends LensSummary {
  workOrder: {
    id: string;
    number: string;
    title: string;
    decisionRule: DecisionRule;
    organisation: { id: string; name: string };
  };
  /** Newest first. */
  measurements: LensMeasurementHistoryItem[];
}

export interface LensResponse {
  lens: LensDetail;
}
export interface CreatedLensResponse {
  lens: LensSummary;
}

/* ---------------------------- part-number spread --------------------------- */

export const partNumberParams = z.object({
  partNumber: z
    .string()
    .trim()
    .min(1, { error: 'The part number must not be empty.' })
    .max(100, { error: 'The part number must be at most 100 characters long.' }),
});

export const partNumberSpreadQuery = z.strictObject({
  /** Part numbers are a client's own; narrow to one organisation when two clients share one. */
  organisationId: uuidField('organisationId').optional(),
});
export type PartNumberSpreadQuery = z.output<typeof partNumberSpreadQuery>;

export interface PartNumberSpreadPoint {
  lensId: string;
  identifier: string;
  measurementId: string;
  measurementNumber: string;
  focalLengthMm: number;
  expandedUncertaintyMm: number;
  decision: ConformityDecision | null;
}

export interface PartNumberSpreadStats {
  count: number;
  meanMm: number;
  /** Sample standard deviation (n − 1). */
  standardDeviationMm: number;
  /** Null when the standard deviation is zero. */
  cp: number | null;
  cpk: number | null;
}

export interface PartNumberSpreadResponse {
  partNumber: string;
  /** The specification of the newest lens with this part number. */
  nominalFocalLengthMm: number;
  tolerancePercent: number | null;
  toleranceMm: number | null;
  lowerLimitMm: number;
  upperLimitMm: number;
  /** Lenses with this part number, measured or not. */
  lensCount: number;
  /** True when lenses of this part number carry different nominal values or tolerances. */
  specificationsDiffer: boolean;
  /** The latest analysed result per lens, ordered by lens identifier. */
  points: PartNumberSpreadPoint[];
  stats: PartNumberSpreadStats | null;
  /** Why stats is null (or why cp/cpk are), as a sentence; null otherwise. */
  statsNote: string | null;
}
