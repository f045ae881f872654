/**
 * Auxiliary-lens method for a diverging lens: put it in contact with a known
 * converging lens, measure the pair, and 1/f_x = 1/f_pair − 1/f_aux
 * (thin lenses in contact: powers add).
 */
import { InvalidOptionError } from '../fit/invalid-option-error';
import { MethodPreconditionError } from './method-precondition-error';

export interface SolveAuxiliaryLensOptions {
  combinedFocalLengthMm: number;
  auxiliaryFocalLengthMm: number;
}

export function solveAuxiliaryLens(options: SolveAuxiliaryLensOptions): { focalLengthMm: number } {
  const { combinedFocalLengthMm, auxiliaryFocalLengthMm } = options;
  if (!Number.isFinite(combinedFocalLengthMm) || combinedFocalLengthMm === 0) {
    throw new InvalidOptionError('Option combinedFocalLengthMm must be a finite, non-zero number.');
  }
  if (!Number.isFinite(auxiliaryFocalLengthMm) || auxiliaryFocalLengthMm === 0) {
    throw new InvalidOptionError('Option auxiliaryFocalLengthMm must be a finite, non-zero number.');
  }
  if (combinedFocalLengthMm < 0) {
    throw new MethodPreconditionError('The lens pair must be converging to form a real image; choose a stronger auxiliary lens.');
  }
  const powerPerMm = 1 / combinedFocalLengthMm - 1 / auxiliaryFocalLengthMm;
  if (Math.abs(powerPerMm) < 1e-12 / Math.min(Math.abs(combinedFocalLengthMm), Math.abs(auxiliaryFocalLengthMm))) {
    throw new MethodPreconditionError('The pair and the auxiliary lens have the same focal length, so the unknown lens shows no measurable power.');
  }
  return { focalLengthMm: 1 / powerPerMm };
}
