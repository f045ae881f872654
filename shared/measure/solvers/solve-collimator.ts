/**
 * Collimator method: a target of size y at the focal plane of a collimator of
 * focal length f_c subtends the field angle θ = atan(y / f_c); the lens under
 * test images it at size y′ in its rear focal plane, so f = y′ / tan θ.
 */
import { InvalidOptionError } from '../fit/invalid-option-error';

export interface SolveCollimatorOptions {
  collimatorFocalLengthMm: number;
  targetSizeMm: number;
  imageSizeMm: number;
  bestFocusPositionMm: number;
  lensPositionMm: number;
}

export interface CollimatorSolution {
  focalLengthMm: number;
  /** Best-focus position − lens mark (the back focal distance when the mark is the rear vertex). */
  backFocalDistanceMm: number;
  fieldAngleRad: number;
}

export function solveCollimator(options: SolveCollimatorOptions): CollimatorSolution {
  for (const name of ['collimatorFocalLengthMm', 'targetSizeMm', 'imageSizeMm', 'bestFocusPositionMm', 'lensPositionMm'] as const) {
    if (!Number.isFinite(options[name])) throw new InvalidOptionError(`Option ${name} must be a finite number.`);
  }
  for (const name of ['collimatorFocalLengthMm', 'targetSizeMm', 'imageSizeMm'] as const) {
    if (!(options[name] > 0)) throw new InvalidOptionError(`Option ${name} must be positive.`);
  }
  const fieldAngleRad = Math.atan(options.targetSizeMm / options.collimatorFocalLengthMm);
  return {
    focalLengthMm: options.imageSizeMm / Math.tan(fieldAngleRad),
    backFocalDistanceMm: options.bestFocusPositionMm - options.lensPositionMm,
    fieldAngleRad,
  };
}
