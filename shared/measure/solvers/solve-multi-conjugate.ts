/**
 * Multi-conjugate method for a thick lens (Abbe's method): with a and b
 * measured from the lens mark and |m| measured, every conjugate gives two
 * equations linear in f and the principal-plane offsets h, h′:
 *   b = h′ + f·(1 + |m|)        a = −h + f·(1 + 1/|m|)
 * solved by generalised least squares. The magnification error enters both
 * equations of a conjugate (sensitivities f and −f/|m|²), so each pair carries
 * a 2 × 2 covariance; since that depends on f, the weights are refined a few times.
 */
import { InvalidOptionError } from '../fit/invalid-option-error';
import { linearLeastSquares } from '../fit/linear-least-squares';

export interface Conjugate {
  objectDistanceFromMarkMm: number;
  imageDistanceFromMarkMm: number;
  magnification: number;
  objectDistanceUncertaintyMm: number;
  imageDistanceUncertaintyMm: number;
  magnificationUncertainty: number;
}

export interface SolveMultiConjugateOptions {
  conjugates: Conjugate[];
  /**
   * 'larger-of-input-and-scatter' (default): covariance × max(1, χ²/ν), so scatter beyond the stated
   * uncertainties widens the result; 'input-uncertainties': covariance from the stated uncertainties only.
   */
  covarianceScaling?: 'larger-of-input-and-scatter' | 'input-uncertainties';
}

export interface MultiConjugateSolution {
  focalLengthMm: number;
  /** h: front principal plane H at mark + h. */
  frontOffsetMm: number;
  /** h′: rear principal plane H′ at mark + h′. */
  rearOffsetMm: number;
  /** Covariance of [focalLengthMm, frontOffsetMm, rearOffsetMm]. */
  covariance: number[][];
  standardUncertainties: { focalLengthMm: number; frontOffsetMm: number; rearOffsetMm: number };
  /** Observed − fitted distance, per conjugate. */
  residuals: { objectDistanceMm: number; imageDistanceMm: number }[];
  degreesOfFreedom: number;
  /** Σ of whitened squared residuals. */
  chiSquare: number;
  /** √(χ²/ν); well above 1 means the data scatter more than their stated uncertainties. */
  birgeRatio: number;
}

export function checkSolveMultiConjugateOptions(options: SolveMultiConjugateOptions) {
  const { conjugates, covarianceScaling = 'larger-of-input-and-scatter' } = options;
  if (!Array.isArray(conjugates) || conjugates.length < 2) {
    throw new InvalidOptionError('Option conjugates needs at least 2 conjugates (object distances) to separate f from the principal planes.');
  }
  conjugates.forEach((c, i) => {
    const fields = ['objectDistanceFromMarkMm', 'imageDistanceFromMarkMm', 'magnification'] as const;
    for (const field of fields) {
      if (!Number.isFinite(c[field])) throw new InvalidOptionError(`Conjugate ${i + 1} needs a finite ${field}.`);
    }
    if (c.magnification === 0) throw new InvalidOptionError(`Conjugate ${i + 1} has a magnification of zero.`);
    const uncertainties = ['objectDistanceUncertaintyMm', 'imageDistanceUncertaintyMm', 'magnificationUncertainty'] as const;
    for (const field of uncertainties) {
      if (!(c[field] >= 0) || !Number.isFinite(c[field])) throw new InvalidOptionError(`Conjugate ${i + 1} needs a ${field} that is zero or positive.`);
    }
    if (c.objectDistanceUncertaintyMm === 0 && c.imageDistanceUncertaintyMm === 0 && c.magnificationUncertainty === 0) {
      throw new InvalidOptionError(`Conjugate ${i + 1} has all uncertainties zero; at least one must be positive to weight it.`);
    }
  });
  const magnitudes = conjugates.map((c) => Math.abs(c.magnification));
  if (magnitudes.every((m) => Math.abs(m - magnitudes[0]) <= 1e-9 * magnitudes[0])) {
    throw new InvalidOptionError('Option conjugates must include at least two different magnifications to separate f from the principal planes.');
  }
  if (covarianceScaling !== 'larger-of-input-and-scatter' && covarianceScaling !== 'input-uncertainties') {
    throw new InvalidOptionError("Option covarianceScaling must be 'larger-of-input-and-scatter' or 'input-uncertainties'.");
  }
  return { conjugates, covarianceScaling };
}

export function solveMultiConjugate(options: SolveMultiConjugateOptions): MultiConjugateSolution {
  const { conjugates, covarianceScaling } = checkSolveMultiConjugateOptions(options);
  // Unknowns [f, h, h′]; rows per conjugate: object-side equation, then image-side equation.
  const rows = conjugates.map((c) => {
    const m = Math.abs(c.magnification);
    return {
      objectRow: [1 + 1 / m, -1, 0],
      imageRow: [1 + m, 0, 1],
      m,
    };
  });
  let focalLengthMm = NaN;
  let solution: ReturnType<typeof linearLeastSquares> | null = null;
  for (let iteration = 0; iteration < 8; iteration++) {
    const design: number[][] = [];
    const observations: number[] = [];
    conjugates.forEach((c, i) => {
      const { objectRow, imageRow, m } = rows[i];
      // Magnification term needs f: the first pass leaves it out.
      const f = Number.isFinite(focalLengthMm) ? focalLengthMm : 0;
      const sensitivityObject = (-f / (m * m)) * c.magnificationUncertainty;
      const sensitivityImage = f * c.magnificationUncertainty;
      const varianceObject = c.objectDistanceUncertaintyMm ** 2 + sensitivityObject ** 2;
      const varianceImage = c.imageDistanceUncertaintyMm ** 2 + sensitivityImage ** 2;
      const covarianceObjectImage = sensitivityObject * sensitivityImage;
      // Whiten the pair with the Cholesky factor of its 2 × 2 covariance (pure rescaling when it is diagonal).
      const fallbackVariance = Math.max(varianceObject, varianceImage, 1e-24);
      const l11 = Math.sqrt(varianceObject > 0 ? varianceObject : fallbackVariance);
      const l21 = covarianceObjectImage / l11;
      const l22 = Math.sqrt(Math.max((varianceImage > 0 ? varianceImage : fallbackVariance) - l21 * l21, 1e-30 * fallbackVariance));
      const whitenedObjectRow = objectRow.map((v) => v / l11);
      const whitenedImageRow = imageRow.map((v, k) => (v - l21 * whitenedObjectRow[k]) / l22);
      const whitenedObject = c.objectDistanceFromMarkMm / l11;
      const whitenedImage = (c.imageDistanceFromMarkMm - l21 * whitenedObject) / l22;
      design.push(whitenedObjectRow, whitenedImageRow);
      observations.push(whitenedObject, whitenedImage);
    });
    solution = linearLeastSquares({ design, observations, weights: new Array(design.length).fill(1) });
    const next = solution.parameters[0];
    const settled = Number.isFinite(focalLengthMm) && Math.abs(next - focalLengthMm) <= 1e-13 * Math.abs(next);
    focalLengthMm = next;
    if (settled) break;
  }
  if (!solution) throw new Error('solveMultiConjugate: no solution computed');
  const [f, h, hPrime] = solution.parameters;
  const degreesOfFreedom = 2 * conjugates.length - 3;
  const chiSquare = solution.residualSumOfSquares;
  const birgeRatio = degreesOfFreedom > 0 ? Math.sqrt(chiSquare / degreesOfFreedom) : NaN;
  const factor = covarianceScaling === 'larger-of-input-and-scatter' && degreesOfFreedom > 0 ? Math.max(1, chiSquare / degreesOfFreedom) : 1;
  const covariance = solution.covariance.map((row) => row.map((v) => v * factor));
  const residuals = conjugates.map((c, i) => ({
    objectDistanceMm: c.objectDistanceFromMarkMm - (f * rows[i].objectRow[0] - h),
    imageDistanceMm: c.imageDistanceFromMarkMm - (f * rows[i].imageRow[0] + hPrime),
  }));
  return {
    focalLengthMm: f,
    frontOffsetMm: h,
    rearOffsetMm: hPrime,
    covariance,
    standardUncertainties: {
      focalLengthMm: Math.sqrt(covariance[0][0]),
      frontOffsetMm: Math.sqrt(covariance[1][1]),
      rearOffsetMm: Math.sqrt(covariance[2][2]),
    },
    residuals,
    degreesOfFreedom,
    chiSquare,
    birgeRatio,
  };
}
