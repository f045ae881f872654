/**
 * Straight line y = slope·x + intercept by (weighted) least squares, with
 * sums taken about the weighted mean of x so that a large offset in x
 * (rail readings of several hundred mm) costs no digits.
 */
import { InvalidOptionError } from './invalid-option-error';

export interface LineFitOptions {
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  /** 1/σ² per point. When given, the covariance is (XᵀWX)⁻¹; when absent, s²·(XᵀX)⁻¹. */
  weights?: ArrayLike<number>;
}

export interface LineFitResult {
  slope: number;
  intercept: number;
  /** [[var(slope), cov], [cov, var(intercept)]]. */
  covariance: [[number, number], [number, number]];
  residualSumOfSquares: number;
  degreesOfFreedom: number;
  residualStandardDeviation: number;
  evaluate(x: number): number;
  /** Standard uncertainty of the fitted line's value at x (from the covariance). */
  standardUncertaintyAt(x: number): number;
}

export function checkLineFitOptions(options: LineFitOptions): { x: Float64Array; y: Float64Array; weights: Float64Array | null } {
  const { x, y, weights } = options;
  if (!x || !y || x.length !== y.length) {
    throw new InvalidOptionError('Options x and y must be arrays of the same length.');
  }
  if (x.length < 2) throw new InvalidOptionError('Options x and y need at least 2 points to fit a line.');
  for (let i = 0; i < x.length; i++) {
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i])) throw new InvalidOptionError(`Options x and y must be finite; point ${i + 1} is not.`);
  }
  let checkedWeights: Float64Array | null = null;
  if (weights !== undefined) {
    if (weights.length !== x.length) throw new InvalidOptionError(`Option weights must have one value per point (${x.length}).`);
    checkedWeights = Float64Array.from(weights);
    checkedWeights.forEach((w, i) => {
      if (!(w > 0) || !Number.isFinite(w)) throw new InvalidOptionError(`Option weights value ${i + 1} must be positive and finite.`);
    });
  }
  return { x: Float64Array.from(x), y: Float64Array.from(y), weights: checkedWeights };
}

export function lineFit(options: LineFitOptions): LineFitResult {
  const { x, y, weights } = checkLineFitOptions(options);
  const n = x.length;
  const w = (i: number) => (weights ? weights[i] : 1);
  let sumW = 0;
  let sumWx = 0;
  let sumWy = 0;
  for (let i = 0; i < n; i++) {
    sumW += w(i);
    sumWx += w(i) * x[i];
    sumWy += w(i) * y[i];
  }
  const meanX = sumWx / sumW;
  const meanY = sumWy / sumW;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    const dx = x[i] - meanX;
    sxx += w(i) * dx * dx;
    sxy += w(i) * dx * (y[i] - meanY);
  }
  if (!(sxx > 0)) throw new InvalidOptionError('Option x must hold at least two different values to fit a line.');
  const slope = sxy / sxx;
  const intercept = meanY - slope * meanX;
  let residualSumOfSquares = 0;
  for (let i = 0; i < n; i++) {
    const r = y[i] - (slope * x[i] + intercept);
    residualSumOfSquares += w(i) * r * r;
  }
  const degreesOfFreedom = n - 2;
  const residualVariance = degreesOfFreedom > 0 ? residualSumOfSquares / degreesOfFreedom : NaN;
  const factor = weights ? 1 : residualVariance;
  // Closed form of (XᵀWX)⁻¹ with centred sums.
  const varianceSlope = factor / sxx;
  const covarianceSlopeIntercept = (-factor * meanX) / sxx;
  const varianceIntercept = factor * (1 / sumW + (meanX * meanX) / sxx);
  return {
    slope,
    intercept,
    covariance: [
      [varianceSlope, covarianceSlopeIntercept],
      [covarianceSlopeIntercept, varianceIntercept],
    ],
    residualSumOfSquares,
    degreesOfFreedom,
    residualStandardDeviation: Math.sqrt(residualVariance),
    evaluate: (at: number) => slope * at + intercept,
    // Written about the mean of x: the textbook form x²·vs + 2x·c + vi cancels badly far from the data.
    standardUncertaintyAt: (at: number) => Math.sqrt(factor * (1 / sumW + (at - meanX) ** 2 / sxx)),
  };
}
