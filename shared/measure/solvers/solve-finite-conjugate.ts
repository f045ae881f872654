/**
 * Finite-conjugate method: one object position, one lens position and the
 * best-focus image position give the object and image distances a and b
 * (from the principal planes), and f two ways: from the Gaussian lens
 * equation f = ab/(a + b), and from the magnification f = b/(1 + |m|).
 */
import { InvalidOptionError } from '../fit/invalid-option-error';
import { MethodPreconditionError } from './method-precondition-error';

export { combineCorrelatedEstimates } from './combine-correlated-estimates';
export { MethodPreconditionError } from './method-precondition-error';

export interface SolveFiniteConjugateOptions {
  objectPositionMm: number;
  /** Reading of the lens carrier's reference mark. */
  lensPositionMm: number;
  /** Best-focus position of the sensor. */
  imagePositionMm: number;
  /** Lateral magnification at best focus (sign ignored). */
  magnification: number;
  /** Front principal plane H sits at lensPositionMm + frontOffsetMm (default 0, thin lens). */
  frontOffsetMm?: number;
  /** Rear principal plane H′ sits at lensPositionMm + rearOffsetMm (default 0, thin lens). */
  rearOffsetMm?: number;
}

export interface FiniteConjugateSolution {
  /** a = (L + h) − z_object. */
  objectDistanceMm: number;
  /** b = z_image − (L + h′). */
  imageDistanceMm: number;
  /** ab / (a + b). */
  fromPositionsMm: number;
  /** b / (1 + |m|). */
  fromMagnificationMm: number;
}

export function checkSolveFiniteConjugateOptions(options: SolveFiniteConjugateOptions): Required<SolveFiniteConjugateOptions> {
  const { frontOffsetMm = 0, rearOffsetMm = 0 } = options;
  const checked = { ...options, frontOffsetMm, rearOffsetMm };
  for (const name of ['objectPositionMm', 'lensPositionMm', 'imagePositionMm', 'magnification', 'frontOffsetMm', 'rearOffsetMm'] as const) {
    if (!Number.isFinite(checked[name])) throw new InvalidOptionError(`Option ${name} must be a finite number.`);
  }
  if (checked.magnification === 0) throw new InvalidOptionError('Option magnification must not be zero.');
  return checked;
}

export function solveFiniteConjugate(options: SolveFiniteConjugateOptions): FiniteConjugateSolution {
  return finiteConjugateSolution(checkSolveFiniteConjugateOptions(options));
}

/**
 * `solveFiniteConjugate` without the option checks, for a model evaluated
 * many times (a Monte Carlo draw) whose inputs were checked once at their
 * nominal values. The geometric preconditions are still enforced.
 */
export function finiteConjugateSolution(options: Required<SolveFiniteConjugateOptions>): FiniteConjugateSolution {
  const { objectPositionMm, lensPositionMm, imagePositionMm, magnification, frontOffsetMm, rearOffsetMm } = options;
  const objectDistanceMm = lensPositionMm + frontOffsetMm - objectPositionMm;
  const imageDistanceMm = imagePositionMm - (lensPositionMm + rearOffsetMm);
  if (!(objectDistanceMm > 0)) {
    throw new MethodPreconditionError(
      `The object must be in front of the lens: object distance ${objectDistanceMm.toFixed(3)} mm is not positive (object at ${objectPositionMm} mm, lens at ${lensPositionMm} mm).`,
    );
  }
  if (!(imageDistanceMm > 0)) {
    throw new MethodPreconditionError(
      `The best-focus image must lie behind the lens: image distance ${imageDistanceMm.toFixed(3)} mm is not positive (image at ${imagePositionMm} mm, lens at ${lensPositionMm} mm).`,
    );
  }
  return {
    objectDistanceMm,
    imageDistanceMm,
    fromPositionsMm: (objectDistanceMm * imageDistanceMm) / (objectDistanceMm + imageDistanceMm),
    fromMagnificationMm: imageDistanceMm / (1 + Math.abs(magnification)),
  };
}
