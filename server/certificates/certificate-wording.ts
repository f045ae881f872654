/**
 * The fixed sentences of a Paraxia certificate. Kept in one place so the
 * tests, the verification page and the PDF say the same thing.
 */
import type { MeasurementMethod } from '../../shared/measure/types';
import type { CertificateEquipmentKind } from './certificate-data';

/**
 * "Calibration certificate" rather than "test report": the lens's focal length
 * is measured and reported with its uncertainty and traceable equipment, which
 * is calibration; the statement of conformity to the tolerance is added on top
 * of that result (ISO/IEC 17025:2017 §7.8.4 and §7.8.6), not instead of it.
 */
export const CERTIFICATE_TITLE = 'Calibration certificate';
export const CERTIFICATE_SUBJECT = 'Focal length of a lens';

export const methodNames: Record<MeasurementMethod, string> = {
  'finite-conjugate': 'Finite conjugate',
  'multi-conjugate': 'Multiple conjugates',
  displacement: 'Displacement (Bessel)',
  collimator: 'Collimator',
  'auxiliary-lens': 'Auxiliary lens',
};

export const methodDescriptions: Record<MeasurementMethod, string> = {
  'finite-conjugate':
    'Object and image distances at one finite conjugate, combined with the measured magnification: 1/a + 1/b = 1/f and f = b/(1 + |m|).',
  'multi-conjugate':
    'Several object and image conjugates fitted together by least squares for the focal length and both principal-plane offsets (thick lens).',
  displacement:
    'Fixed object-to-sensor distance D and the two lens positions, d apart, that give a sharp image: f = (D² − d²)/(4D).',
  collimator:
    'Target at the focal plane of a collimator of known focal length; f follows from the size of the target’s image at best focus.',
  'auxiliary-lens':
    'The lens in contact with a known converging lens; the pair is measured and 1/f = 1/f(pair) − 1/f(auxiliary lens).',
};

export const equipmentKindNames: Record<CertificateEquipmentKind, string> = {
  camera: 'Camera',
  target: 'Target',
  'rail-scale': 'Rail scale',
  collimator: 'Collimator',
  'auxiliary-lens': 'Auxiliary lens',
  'environment-monitor': 'Environment monitor',
  other: 'Other',
};

export const decisionRuleNames = {
  simple: 'Simple acceptance',
  guarded: 'Guarded acceptance, guard band w = U',
} as const;

export const decisionRuleDescriptions = {
  simple:
    'The item conforms when the measured focal length lies within the tolerance limits (limits included), and does not conform otherwise; the uncertainty is not used as a guard band (ILAC-G8:09/2019, JCGM 106:2012).',
  guarded:
    'The item conforms when the measured focal length lies inside the tolerance limits by at least the expanded uncertainty U, does not conform when it lies outside them by more than U, and otherwise no decision is made at this uncertainty (ILAC-G8:09/2019, JCGM 106:2012).',
} as const;

export const decisionWords = {
  conforms: 'Conforms',
  'does-not-conform': 'Does not conform',
  undecided: 'Undecided',
} as const;

export const RELATES_ONLY_TO_ITEM = 'The results relate only to the item measured, as received, under the conditions stated.';
export const REPRODUCE_IN_FULL = 'This certificate shall not be reproduced except in full without the written approval of the issuing laboratory.';

export function responsibilityStatement(labName: string): string {
  return `This certificate is ${labName}’s own statement. Conformity decisions, accreditation and traceability claims remain the laboratory’s responsibility under its quality system and local regulations.`;
}

export const SAFETY_CAUTION =
  'Safety: bench light sources are bright. Never look into a collimated beam or a laser; keep a focusing lens away from sunlight and anything flammable; follow the laser class of the source and local rules.';

export function replacementStatement(replacedRevision: number, reason: string): string {
  return `This revision replaces revision ${replacedRevision}, which is withdrawn. Reason: ${reason}`;
}

export function uncertaintyStatement(coverageFactorText: string, coveragePercentText: string, effectiveDegreesOfFreedomText: string | null): string {
  const freedom = effectiveDegreesOfFreedomText ? ` for ${effectiveDegreesOfFreedomText} effective degrees of freedom (Welch–Satterthwaite)` : '';
  return (
    `The reported expanded uncertainty is the combined standard uncertainty multiplied by the coverage factor k = ${coverageFactorText}, ` +
    `taken from Student’s t distribution${freedom}, giving a coverage probability of approximately ${coveragePercentText} %. ` +
    'The standard uncertainty was evaluated following JCGM 100:2008 (GUM).'
  );
}

export function verificationInstruction(url: string): string {
  return `Anyone holding this certificate can confirm that it is genuine and current at ${url}`;
}
