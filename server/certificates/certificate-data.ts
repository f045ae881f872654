/**
 * What a certificate prints: the contents ISO/IEC 17025:2017 §7.8.2 asks for
 * (methods.md §9), checked with zod before anything is drawn. The schema
 * also refuses data that contradicts itself (limits that do not follow from
 * the nominal and tolerance, a decision the rule does not give, equipment
 * past its due date without an override), because a signed certificate must
 * never print such a thing.
 */
import { z } from 'zod';
import type { BudgetRow } from '../../shared/measure/types';
import { measurementMethods } from '../../shared/schemas/measurement-manifest';
import { decideConformity } from '../../shared/measure/conformity/decide-conformity';
import { toleranceLimits } from '../../shared/measure/conformity/tolerance-limits';
import { unprintableCharacters } from './certificate-fonts';
import { verificationCodePattern } from './verification-code';

const text = (maxLength = 200) =>
  z
    .string()
    .trim()
    .min(1, 'must not be empty')
    .max(maxLength, `must be at most ${maxLength} characters`)
    .superRefine((value, ctx) => {
      const missing = unprintableCharacters(value);
      if (missing.length > 0) {
        const shown = missing.map((c) => (c.codePointAt(0)! < 32 ? `U+${c.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}` : `"${c}"`));
        ctx.addIssue({ code: 'custom', message: `contains characters the certificate fonts cannot print: ${shown.join(', ')}` });
      }
    });
/** A number in a message: six significant digits are plenty to see what was expected. */
const shown = (value: number) => String(Number(value.toPrecision(6)));
const isoDate = () => z.iso.date({ error: 'must be a calendar date written YYYY-MM-DD' });
const finite = () => z.number();
const nonNegative = () => z.number().min(0);
const positive = () => z.number().positive();

export const equipmentKinds = ['camera', 'target', 'rail-scale', 'collimator', 'auxiliary-lens', 'environment-monitor', 'other'] as const;

const personSchema = z.object({
  name: text(120),
  role: text(120),
  date: isoDate(),
});

const focusCurveSchema = z.object({
  positionsMm: z.array(finite()).min(3),
  focusValues: z.array(finite()).min(3),
  /** The fitted model sampled across its window. */
  curve: z.array(z.object({ positionMm: finite(), value: finite() })).min(2),
  bestFocusPositionMm: finite(),
  bestFocusStandardUncertaintyMm: nonNegative(),
  /** Displacement sweeps: the second sharp position and its fitted model. */
  secondPeak: z
    .object({
      curve: z.array(z.object({ positionMm: finite(), value: finite() })).min(2),
      bestFocusPositionMm: finite(),
      bestFocusStandardUncertaintyMm: nonNegative(),
    })
    .optional(),
});

const sweepSchema = z.object({
  label: text(80),
  /** Lateral magnification |m| at each best focus: one, two for a displacement sweep, none when not measured. */
  magnifications: z.array(positive()).max(2),
  focusCurve: focusCurveSchema,
});

const budgetRowSchema = z.object({
  source: text(120),
  value: finite(),
  unit: z.string().trim().max(24),
  standardUncertainty: nonNegative(),
  /** Infinity (or null once sent as JSON) for an input with no degrees of freedom. */
  degreesOfFreedom: z.union([positive(), z.literal(Infinity), z.null()]),
  sensitivity: finite(),
  contributionMm: nonNegative(),
  varianceShare: z.number().min(0).max(1),
});

// The engine's BudgetRow must stay acceptable as it is.
const budgetRowFitsSchema: BudgetRow extends z.input<typeof budgetRowSchema> ? true : never = true;
void budgetRowFitsSchema;

const equipmentSchema = z.object({
  kind: z.enum(equipmentKinds),
  identifier: text(60),
  description: text(200),
  calibrationReference: text(120),
  calibrationDueDate: isoDate(),
  /** A reviewer's recorded permission to use the item past its due date. */
  override: z
    .object({
      reason: text(400),
      approvedBy: text(120),
      approvedOn: isoDate(),
    })
    .optional(),
});

export const certificateDataSchema = z
  .object({
    certificate: z.object({
      number: text(40).regex(/^[A-Z0-9][A-Z0-9/-]*$/, 'must use capital letters, digits, "-" and "/" only'),
      revision: z.number().int().min(1),
      issueDate: isoDate(),
      /** Required from revision 2 on: the revision this one withdraws, and why. */
      replaces: z.object({ revision: z.number().int().min(1), reason: text(500) }).optional(),
    }),
    lab: z.object({
      name: text(120),
      addressLines: z.array(text(120)).min(1).max(5),
      email: z.email().optional(),
      phone: text(40).optional(),
    }),
    client: z.object({
      name: text(120),
      // Up to five lines of postal address and two of the contact.
      addressLines: z.array(text(120)).min(1).max(7),
      orderReference: text(80).optional(),
    }),
    item: z.object({
      identifier: text(60),
      serialNumber: text(60).optional(),
      description: text(200),
      partNumber: text(60).optional(),
      /** Negative for a diverging lens. */
      nominalFocalLengthMm: finite().refine((v) => v !== 0, 'must not be zero'),
      /** Exactly one of the two: ± percent of |nominal|, or ± millimetres. */
      tolerance: z.object({ percent: positive().optional(), mm: positive().optional() }),
      dateReceived: isoDate().optional(),
      condition: text(200).optional(),
    }),
    measurement: z.object({
      method: z.enum(measurementMethods),
      /** Each day the item was measured, ascending. */
      dates: z.array(isoDate()).min(1).max(10),
      location: text(160).optional(),
      environment: z.object({
        temperatureC: z.number().min(-40).max(80),
        relativeHumidityPercent: z.number().min(0).max(100),
      }),
    }),
    equipment: z.array(equipmentSchema).min(1).max(16),
    results: z.object({
      focalLengthMm: finite().refine((v) => v !== 0, 'must not be zero'),
      standardUncertaintyMm: positive(),
      expandedUncertaintyMm: positive(),
      coverageFactor: z.number().min(1).max(20),
      /** 0..1, e.g. 0.95. */
      coverageProbability: z.number().gt(0).lt(1),
      effectiveDegreesOfFreedom: z.union([positive(), z.literal(Infinity), z.null()]).optional(),
      opticalPowerDioptres: finite(),
      opticalPowerExpandedUncertaintyDioptres: positive(),
      backFocalDistanceMm: finite().optional(),
      backFocalDistanceStandardUncertaintyMm: nonNegative().optional(),
      principalPlanes: z
        .object({
          frontOffsetMm: finite(),
          rearOffsetMm: finite(),
          frontOffsetStandardUncertaintyMm: nonNegative().optional(),
          rearOffsetStandardUncertaintyMm: nonNegative().optional(),
        })
        .optional(),
      sweeps: z.array(sweepSchema).min(1).max(12),
      uncertaintyBudget: z.array(budgetRowSchema).min(1).max(24),
    }),
    conformity: z.object({
      rule: z.enum(['simple', 'guarded']),
      decision: z.enum(['conforms', 'does-not-conform', 'undecided']),
      lowerLimitMm: finite(),
      upperLimitMm: finite(),
    }),
    people: z.object({
      performedBy: z.array(personSchema).min(1).max(4),
      authorisedBy: personSchema,
    }),
    remarks: z.array(text(600)).max(6).optional(),
    verification: z.object({
      code: z.string().regex(verificationCodePattern, 'must be a code of grouped characters such as 7KQ4-MX2R-9TWH'),
      publicBaseUrl: z
        .url({ protocol: /^https?$/, error: 'must be an http(s) address' })
        .refine((u) => !/[?#]/.test(u), 'must not carry a query or fragment'),
    }),
  })
  .superRefine((data, ctx) => {
    const need = (condition: boolean, path: (string | number)[], message: string) => {
      if (!condition) ctx.addIssue({ code: 'custom', path, message });
    };
    const { certificate, item, results, conformity, measurement, people } = data;

    if (certificate.revision > 1) {
      need(certificate.replaces !== undefined, ['certificate', 'replaces'], 'is required from revision 2 on (the withdrawn revision and the reason)');
      if (certificate.replaces) {
        need(certificate.replaces.revision < certificate.revision, ['certificate', 'replaces', 'revision'], `must be below the certificate's revision ${certificate.revision}`);
      }
    } else {
      need(certificate.replaces === undefined, ['certificate', 'replaces'], 'must be left out of a first revision');
    }

    const sortedDates = [...measurement.dates].sort();
    need(sortedDates.every((d, i) => d === measurement.dates[i]), ['measurement', 'dates'], 'must be in ascending order');
    const lastMeasurementDate = sortedDates[sortedDates.length - 1];
    need(lastMeasurementDate <= certificate.issueDate, ['certificate', 'issueDate'], `must not be before the last measurement date ${lastMeasurementDate}`);
    need(people.authorisedBy.date <= certificate.issueDate, ['people', 'authorisedBy', 'date'], `must not be after the date of issue ${certificate.issueDate}`);
    people.performedBy.forEach((person, i) => {
      need(person.name !== people.authorisedBy.name, ['people', 'authorisedBy', 'name'], 'must name someone other than the people who performed the measurement (four-eyes rule)');
      need(person.date <= people.authorisedBy.date, ['people', 'performedBy', i, 'date'], `must not be after the authorisation date ${people.authorisedBy.date}`);
    });

    data.equipment.forEach((entry, i) => {
      if (entry.calibrationDueDate < lastMeasurementDate) {
        need(
          entry.override !== undefined,
          ['equipment', i, 'override'],
          `is required: ${entry.identifier} was past its calibration due date ${entry.calibrationDueDate} when measured on ${lastMeasurementDate}`,
        );
      }
    });

    const { percent, mm } = item.tolerance;
    need((percent === undefined) !== (mm === undefined), ['item', 'tolerance'], 'must give exactly one of percent and mm');
    if ((percent === undefined) !== (mm === undefined)) {
      const limits = toleranceLimits({ nominalFocalLengthMm: item.nominalFocalLengthMm, tolerancePercent: percent, toleranceMm: mm });
      const slackMm = 1e-9 * Math.abs(item.nominalFocalLengthMm);
      need(Math.abs(limits.lowerLimit - conformity.lowerLimitMm) <= slackMm, ['conformity', 'lowerLimitMm'], `must equal the limit that follows from the nominal value and tolerance (${shown(limits.lowerLimit)} mm)`);
      need(Math.abs(limits.upperLimit - conformity.upperLimitMm) <= slackMm, ['conformity', 'upperLimitMm'], `must equal the limit that follows from the nominal value and tolerance (${shown(limits.upperLimit)} mm)`);
    }
    if (conformity.lowerLimitMm < conformity.upperLimitMm) {
      const decided = decideConformity({
        measuredValue: results.focalLengthMm,
        expandedUncertainty: results.expandedUncertaintyMm,
        lowerLimit: conformity.lowerLimitMm,
        upperLimit: conformity.upperLimitMm,
        rule: conformity.rule,
      });
      need(decided.decision === conformity.decision, ['conformity', 'decision'], `must be '${decided.decision}', which the ${conformity.rule} rule gives for the reported value and U`);
    } else {
      need(false, ['conformity', 'upperLimitMm'], 'must be above lowerLimitMm');
    }

    const expectedU = results.coverageFactor * results.standardUncertaintyMm;
    need(Math.abs(results.expandedUncertaintyMm - expectedU) <= 1e-3 * expectedU, ['results', 'expandedUncertaintyMm'], `must equal coverageFactor × standardUncertaintyMm (${shown(expectedU)} mm)`);
    const expectedPower = 1000 / results.focalLengthMm;
    need(Math.abs(results.opticalPowerDioptres - expectedPower) <= 1e-6 * Math.abs(expectedPower), ['results', 'opticalPowerDioptres'], `must equal 1000 / focalLengthMm (${shown(expectedPower)} D)`);

    results.sweeps.forEach((sweep, i) => {
      const curve = sweep.focusCurve;
      need(curve.focusValues.length === curve.positionsMm.length, ['results', 'sweeps', i, 'focusCurve', 'focusValues'], `must hold one value per position (${curve.positionsMm.length})`);
      need(measurement.method === 'displacement' || curve.secondPeak === undefined, ['results', 'sweeps', i, 'focusCurve', 'secondPeak'], 'is only for the displacement method');
    });
  }, { when: (payload) => payload.issues.length === 0 }); // cross-field checks only on data whose fields are each well formed

export type CertificateData = z.infer<typeof certificateDataSchema>;
export type CertificateEquipmentKind = (typeof equipmentKinds)[number];

/** The caller's data does not make a certificate; `fields` maps each dotted field path to what is wrong with it. */
export class CertificateDataError extends Error {
  constructor(
    message: string,
    readonly fields: Record<string, string>,
  ) {
    super(message);
    this.name = 'CertificateDataError';
  }
}

function fieldPath(path: PropertyKey[]): string {
  return path.reduce<string>((out, key) => (typeof key === 'number' ? `${out}[${key}]` : out ? `${out}.${String(key)}` : String(key)), '');
}

const article = (noun: string) => (/^[aeiou]/.test(noun) ? `an ${noun}` : `a ${noun}`);

// Phrases zod's own issues as the end of a sentence that starts with the field's name.
const describeIssue: z.core.$ZodErrorMap = (issue) => {
  switch (issue.code) {
    case 'invalid_type':
      if (issue.input === undefined) return 'is missing';
      return `must be ${article(issue.expected === 'array' ? 'list' : issue.expected)}`;
    case 'too_small':
      if (issue.origin === 'array') return `must list at least ${issue.minimum} ${Number(issue.minimum) === 1 ? 'entry' : 'entries'}`;
      if (issue.origin === 'string') return 'must not be empty';
      return `must be ${issue.inclusive ? 'at least' : 'greater than'} ${issue.minimum}`;
    case 'too_big':
      if (issue.origin === 'array') return `must list at most ${issue.maximum} entries`;
      if (issue.origin === 'string') return `must be at most ${issue.maximum} characters`;
      return `must be ${issue.inclusive ? 'at most' : 'less than'} ${issue.maximum}`;
    case 'invalid_value':
      return `must be one of ${issue.values.map((v) => `'${String(v)}'`).join(', ')}`;
    case 'invalid_format':
      return issue.format === 'email' ? 'must be an e-mail address' : `must be a valid ${issue.format}`;
    case 'invalid_union':
      return 'is not in any accepted form';
    default:
      return undefined;
  }
};

/** Checks and returns the data, or throws CertificateDataError whose message is one sentence per bad field. */
export function parseCertificateData(input: unknown): CertificateData {
  const parsed = certificateDataSchema.safeParse(input, { error: describeIssue });
  if (parsed.success) return parsed.data;
  const fields: Record<string, string> = {};
  for (const issue of parsed.error.issues) {
    const field = fieldPath(issue.path) || 'the certificate data';
    fields[field] ??= `${field} ${issue.message}.`;
  }
  const sentences = Object.values(fields);
  throw new CertificateDataError(
    `The certificate cannot be drawn: ${sentences[0]}${sentences.length > 1 ? ` (and ${sentences.length - 1} more problem${sentences.length > 2 ? 's' : ''})` : ''}`,
    fields,
  );
}
