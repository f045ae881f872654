/**
 * Best linear unbiased combination of correlated estimates of one quantity
 * (generalised least squares): weights Σ⁻¹1 / (1ᵀΣ⁻¹1), variance 1/(1ᵀΣ⁻¹1).
 * Weights can be negative when the correlation is strong; that is correct.
 */
import { InvalidOptionError } from '../fit/invalid-option-error';
import { SingularMatrixError, solveSymmetricPositiveDefinite } from '../fit/dense-linear-algebra';

export interface CombineCorrelatedEstimatesOptions {
  values: number[];
  covariance: number[][];
}

export interface CombinedEstimate {
  value: number;
  variance: number;
  weights: number[];
}

export function combineCorrelatedEstimates(options: CombineCorrelatedEstimatesOptions): CombinedEstimate {
  const { values, covariance } = options;
  if (!Array.isArray(values) || values.length === 0 || !values.every(Number.isFinite)) {
    throw new InvalidOptionError('Option values must be a non-empty array of finite numbers.');
  }
  const n = values.length;
  if (!Array.isArray(covariance) || covariance.length !== n || covariance.some((row) => !Array.isArray(row) || row.length !== n)) {
    throw new InvalidOptionError(`Option covariance must be a ${n} × ${n} matrix, one row and column per value.`);
  }
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      if (!Number.isFinite(covariance[i][j])) throw new InvalidOptionError('Option covariance must hold finite numbers.');
      if (Math.abs(covariance[i][j] - covariance[j][i]) > 1e-12 * Math.sqrt(Math.abs(covariance[i][i] * covariance[j][j]))) {
        throw new InvalidOptionError('Option covariance must be symmetric.');
      }
    }
  }
  let inverseTimesOnes: number[];
  try {
    inverseTimesOnes = solveSymmetricPositiveDefinite(covariance, new Array(n).fill(1));
  } catch (error) {
    if (!(error instanceof SingularMatrixError)) throw error;
    throw new InvalidOptionError('Option covariance must be positive definite (the estimates cannot be fully correlated or certain).');
  }
  const total = inverseTimesOnes.reduce((s, x) => s + x, 0);
  const weights = inverseTimesOnes.map((x) => x / total);
  const value = weights.reduce((s, w, i) => s + w * values[i], 0);
  return { value, variance: 1 / total, weights };
}
