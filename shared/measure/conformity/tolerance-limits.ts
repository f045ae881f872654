/** Tolerance limits around a nominal focal length, from a percentage or an absolute tolerance (exactly one). */
import { InvalidOptionError } from '../fit/invalid-option-error';

export interface ToleranceLimitsOptions {
  nominalFocalLengthMm: number;
  /** ± percent of |nominal|. */
  tolerancePercent?: number;
  /** ± millimetres. */
  toleranceMm?: number;
}

export function toleranceLimits(options: ToleranceLimitsOptions): { lowerLimit: number; upperLimit: number } {
  const { nominalFocalLengthMm, tolerancePercent, toleranceMm } = options;
  if (!Number.isFinite(nominalFocalLengthMm) || nominalFocalLengthMm === 0) {
    throw new InvalidOptionError('Option nominalFocalLengthMm must be a finite, non-zero number.');
  }
  if ((tolerancePercent === undefined) === (toleranceMm === undefined)) {
    throw new InvalidOptionError('Give exactly one of the options tolerancePercent and toleranceMm.');
  }
  const halfWidthMm = tolerancePercent !== undefined ? (Math.abs(nominalFocalLengthMm) * tolerancePercent) / 100 : toleranceMm!;
  if (!(halfWidthMm > 0) || !Number.isFinite(halfWidthMm)) {
    throw new InvalidOptionError(`Option ${tolerancePercent !== undefined ? 'tolerancePercent' : 'toleranceMm'} must be a positive finite number.`);
  }
  return { lowerLimit: nominalFocalLengthMm - halfWidthMm, upperLimit: nominalFocalLengthMm + halfWidthMm };
}
