import { describe, expect, it } from 'vitest';
import { lineFit } from '@shared/measure/fit/line-fit';
import { linearLeastSquares } from '@shared/measure/fit/linear-least-squares';
import { invertSymmetricPositiveDefinite, multiply, SingularMatrixError, solveSymmetricPositiveDefinite } from '@shared/measure/fit/dense-linear-algebra';
import { levenbergMarquardtFit } from '@shared/measure/fit/levenberg-marquardt-fit';
import { createSeededRandom } from '@shared/measure/uncertainty/seeded-random';

describe('lineFit', () => {
  it('recovers an exact line at rail positions of several hundred mm without losing digits', () => {
    const x = [447.0, 447.25, 447.5, 447.75, 448.0, 448.25];
    const y = x.map((z) => 0.0123 * (z - 447.6) + 2.345);
    const fit = lineFit({ x, y });
    expect(fit.slope).toBeCloseTo(0.0123, 12);
    expect(fit.evaluate(447.6)).toBeCloseTo(2.345, 12);
    expect(fit.residualSumOfSquares).toBeLessThan(1e-24);
    expect(fit.degreesOfFreedom).toBe(4);
  });

  it('matches the textbook closed-form variances s²/Sxx and s²(1/n + x̄²/Sxx) (from memory) and the general solver', () => {
    const random = createSeededRandom(9);
    const x = Array.from({ length: 12 }, (_, i) => 10 + i * 0.5);
    const y = x.map((v) => 3 - 0.2 * v + 0.05 * random.nextNormal());
    const fit = lineFit({ x, y });
    const n = x.length;
    const meanX = x.reduce((s, v) => s + v, 0) / n;
    const sxx = x.reduce((s, v) => s + (v - meanX) ** 2, 0);
    const s2 = fit.residualSumOfSquares / (n - 2);
    expect(fit.covariance[0][0]).toBeCloseTo(s2 / sxx, 14);
    expect(fit.covariance[1][1]).toBeCloseTo(s2 * (1 / n + (meanX * meanX) / sxx), 14);
    expect(fit.covariance[0][1]).toBeCloseTo((-s2 * meanX) / sxx, 14);
    const general = linearLeastSquares({ design: x.map((v) => [v, 1]), observations: y });
    expect(general.parameters[0]).toBeCloseTo(fit.slope, 12);
    expect(general.parameters[1]).toBeCloseTo(fit.intercept, 11);
    expect(general.covariance[0][1]).toBeCloseTo(fit.covariance[0][1], 12);
    const at = 13.3;
    const varianceAt = at * at * fit.covariance[0][0] + 2 * at * fit.covariance[0][1] + fit.covariance[1][1];
    expect(fit.standardUncertaintyAt(at)).toBeCloseTo(Math.sqrt(varianceAt), 12);
  });

  it('uses weights as 1/σ² and leaves the covariance unscaled: var(slope) = 1/Σw(x − x̄_w)²', () => {
    const x = [1, 2, 3, 4, 5];
    const y = [2.1, 3.9, 6.2, 7.8, 10.1];
    const weights = [1, 4, 1, 4, 1];
    const fit = lineFit({ x, y, weights });
    const sumW = weights.reduce((s, w) => s + w, 0);
    const meanX = weights.reduce((s, w, i) => s + w * x[i], 0) / sumW;
    const sxx = weights.reduce((s, w, i) => s + w * (x[i] - meanX) ** 2, 0);
    expect(fit.covariance[0][0]).toBeCloseTo(1 / sxx, 14);
    const general = linearLeastSquares({ design: x.map((v) => [v, 1]), observations: y, weights });
    expect(general.parameters[0]).toBeCloseTo(fit.slope, 12);
    expect(general.covariance[1][1]).toBeCloseTo(fit.covariance[1][1], 12);
  });

  it('names the bad option', () => {
    expect(() => lineFit({ x: [1, 1, 1], y: [1, 2, 3] })).toThrow('Option x must hold at least two different values to fit a line.');
    expect(() => lineFit({ x: [1], y: [1] })).toThrow('Options x and y need at least 2 points to fit a line.');
  });
});

describe('linearLeastSquares', () => {
  it('recovers an exact quadratic and reports zero residuals', () => {
    const x = Array.from({ length: 9 }, (_, i) => i - 4);
    const design = x.map((v) => [1, v, v * v]);
    const observations = x.map((v) => 1.5 - 0.25 * v + 0.125 * v * v);
    const result = linearLeastSquares({ design, observations });
    expect(result.parameters[0]).toBeCloseTo(1.5, 13);
    expect(result.parameters[1]).toBeCloseTo(-0.25, 13);
    expect(result.parameters[2]).toBeCloseTo(0.125, 13);
    expect(Math.max(...result.residuals.map(Math.abs))).toBeLessThan(1e-13);
    expect(result.degreesOfFreedom).toBe(6);
  });

  it('recovers exact parameters to 1e-8 from a badly scaled design (columns from 1 to 6e13)', () => {
    const x = Array.from({ length: 20 }, (_, i) => 100 + i * 5);
    const design = x.map((v) => [1, v, v * v, v * v * v * v * v * v]);
    const truth = [2, -0.01, 3e-5, 1e-13];
    const observations = design.map((row) => row.reduce((s, a, j) => s + a * truth[j], 0));
    const result = linearLeastSquares({ design, observations });
    result.parameters.forEach((p, j) => expect(Math.abs(p - truth[j]) / Math.abs(truth[j])).toBeLessThan(1e-8));
  });

  it('throws SingularMatrixError when two parameters cannot be separated', () => {
    const design = [[1, 2], [2, 4], [3, 6]];
    expect(() => linearLeastSquares({ design, observations: [1, 2, 3] })).toThrow(SingularMatrixError);
  });
});

describe('dense linear algebra', () => {
  it('inverts an ill-conditioned Hilbert matrix (n = 6, condition ≈ 1.5e7) so that H·H⁻¹ ≈ I to 1e-8', () => {
    const n = 6;
    const hilbert = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => 1 / (i + j + 1)));
    const product = multiply(hilbert, invertSymmetricPositiveDefinite(hilbert));
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) expect(Math.abs(product[i][j] - (i === j ? 1 : 0))).toBeLessThan(1e-8);
    const x = solveSymmetricPositiveDefinite(hilbert, hilbert.map((row) => row.reduce((s, v) => s + v, 0)));
    x.forEach((v) => expect(v).toBeCloseTo(1, 7));
  });

  it('refuses a matrix that is not positive definite', () => {
    expect(() => solveSymmetricPositiveDefinite([[1, 2], [2, 1]], [1, 1])).toThrow(SingularMatrixError);
  });
});

describe('levenbergMarquardtFit', () => {
  it('recovers the parameters of an exponential decay from generated noisy data within 3 stated standard errors', () => {
    const random = createSeededRandom(17);
    const x = Array.from({ length: 40 }, (_, i) => i * 0.25);
    const truth = [5, 0.7, 0.3];
    const model = (b: number[]) => (t: number) => b[0] * Math.exp(-b[1] * t) + b[2];
    const y = x.map((t) => model(truth)(t) + 0.02 * random.nextNormal());
    const fit = levenbergMarquardtFit({ x, y, model, initialParameters: [3, 1.5, 0] });
    expect(fit.converged).toBe(true);
    fit.parameters.forEach((p, j) => expect(Math.abs(p - truth[j])).toBeLessThan(3 * fit.standardErrors[j]));
    expect(fit.residualStandardDeviation).toBeGreaterThan(0.015);
    expect(fit.residualStandardDeviation).toBeLessThan(0.025);
  });

  it('treats weights as 1/σ² so that known-σ covariance is (JᵀWJ)⁻¹ and equals the linear result for a line', () => {
    const x = [0, 1, 2, 3, 4, 5];
    const y = [1.1, 2.9, 5.2, 6.8, 9.1, 11.0];
    const weights = [4, 4, 1, 1, 4, 4];
    const fit = levenbergMarquardtFit({ x, y, weights, model: (b) => (t) => b[0] * t + b[1], initialParameters: [1, 0], scaleCovarianceByResidualVariance: false });
    const line = lineFit({ x, y, weights });
    expect(fit.parameters[0]).toBeCloseTo(line.slope, 10);
    expect(fit.covariance[0][0]).toBeCloseTo(line.covariance[0][0], 10);
    expect(fit.covariance[1][1]).toBeCloseTo(line.covariance[1][1], 10);
  });

  it('names the bad option', () => {
    expect(() => levenbergMarquardtFit({ x: [1, 2], y: [1, 2], model: (b) => () => b[0], initialParameters: [1, 2] })).toThrow(
      'Options x and y need more points (2) than parameters (2) to leave degrees of freedom for the uncertainty.',
    );
    expect(() => levenbergMarquardtFit({ x: [1, 2, 3], y: [1, 2, 3], weights: [1, 0, 1], model: (b) => () => b[0], initialParameters: [1] })).toThrow(
      'Option weights must be positive and finite; point 2 has 0.',
    );
  });
});
