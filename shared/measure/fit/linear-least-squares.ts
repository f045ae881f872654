/**
 * Linear least squares A·θ ≈ y (optionally weighted), solved by Householder
 * QR of the column-scaled design matrix; never through the normal equations.
 */
import { InvalidOptionError } from './invalid-option-error';
import { solveLeastSquares } from './dense-linear-algebra';

export interface LinearLeastSquaresOptions {
  /** One row per observation, one column per parameter. */
  design: number[][];
  observations: number[];
  /** 1/σ² per observation. When given, the covariance is (AᵀWA)⁻¹; when absent, s²·(AᵀA)⁻¹. */
  weights?: number[];
}

export interface LinearLeastSquaresResult {
  parameters: number[];
  covariance: number[][];
  /** observation − fitted value, unweighted. */
  residuals: number[];
  /** Σ wᵢ·residualᵢ² (wᵢ = 1 without weights). */
  residualSumOfSquares: number;
  degreesOfFreedom: number;
}

export function checkLinearLeastSquaresOptions(options: LinearLeastSquaresOptions): Required<LinearLeastSquaresOptions> {
  const { design, observations, weights } = options;
  if (!Array.isArray(design) || design.length === 0 || !Array.isArray(design[0]) || design[0].length === 0) {
    throw new InvalidOptionError('Option design must be a non-empty matrix given as an array of rows.');
  }
  const parameterCount = design[0].length;
  if (!Array.isArray(observations) || observations.length !== design.length) {
    throw new InvalidOptionError(`Option observations must have one value per design row (${design.length}).`);
  }
  if (design.length < parameterCount) {
    throw new InvalidOptionError(`Option design needs at least as many rows (${design.length}) as parameters (${parameterCount}).`);
  }
  design.forEach((row, i) => {
    if (!Array.isArray(row) || row.length !== parameterCount || !row.every(Number.isFinite)) {
      throw new InvalidOptionError(`Option design row ${i + 1} must hold ${parameterCount} finite numbers.`);
    }
  });
  observations.forEach((v, i) => {
    if (!Number.isFinite(v)) throw new InvalidOptionError(`Option observations value ${i + 1} is not a finite number.`);
  });
  if (weights !== undefined) {
    if (!Array.isArray(weights) || weights.length !== design.length) {
      throw new InvalidOptionError(`Option weights must have one value per design row (${design.length}).`);
    }
    weights.forEach((w, i) => {
      if (!(w > 0) || !Number.isFinite(w)) throw new InvalidOptionError(`Option weights value ${i + 1} must be positive and finite.`);
    });
  }
  return { design, observations, weights: weights ?? [] };
}

export function linearLeastSquares(options: LinearLeastSquaresOptions): LinearLeastSquaresResult {
  const { design, observations, weights } = checkLinearLeastSquaresOptions(options);
  const weighted = weights.length > 0;
  const rootWeights = design.map((_, i) => (weighted ? Math.sqrt(weights[i]) : 1));
  const scaledDesign = design.map((row, i) => row.map((v) => v * rootWeights[i]));
  const scaledObservations = observations.map((v, i) => v * rootWeights[i]);
  const solution = solveLeastSquares(scaledDesign, scaledObservations);
  const degreesOfFreedom = design.length - design[0].length;
  const residualSumOfSquares = solution.residualSumOfSquares;
  let factor = 1;
  if (!weighted) factor = degreesOfFreedom > 0 ? residualSumOfSquares / degreesOfFreedom : NaN;
  const covariance = solution.inverseNormalMatrix.map((row) => row.map((v) => v * factor));
  const residuals = solution.residuals.map((r, i) => r / rootWeights[i]);
  return { parameters: solution.solution, covariance, residuals, residualSumOfSquares, degreesOfFreedom };
}
