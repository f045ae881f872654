/**
 * Nonlinear least squares: iterations by `ml-levenberg-marquardt`, then a
 * polish by our own damped Gauss–Newton steps (QR of the column-scaled
 * Jacobian) and a covariance s²·(JᵀWJ)⁻¹ at the solution.
 *
 * Parameters are divided by the magnitude of their starting values while
 * iterating: the library damps with a plain identity (no Marquardt scaling),
 * which stalls when parameters differ by orders of magnitude.
 */
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { InvalidOptionError } from './invalid-option-error';
import { solveLeastSquares, SingularMatrixError, type Matrix } from './dense-linear-algebra';

export type ParameterizedModel = (parameters: number[]) => (x: number) => number;
/** Partial derivatives of the model with respect to each parameter, at x. */
export type ParameterizedJacobian = (parameters: number[]) => (x: number) => number[];

export interface LevenbergMarquardtFitOptions {
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  model: ParameterizedModel;
  initialParameters: number[];
  /** 1/σ² per point; absent means all 1. */
  weights?: ArrayLike<number>;
  /** Iterations of the library's Levenberg–Marquardt loop (default 200). */
  maxIterations?: number;
  /** Analytic model derivatives; central differences are used when absent. */
  jacobian?: ParameterizedJacobian;
  /** true (default): covariance = s²·(JᵀWJ)⁻¹. false: (JᵀWJ)⁻¹, for weights that are known 1/σ². */
  scaleCovarianceByResidualVariance?: boolean;
}

export interface LevenbergMarquardtFitResult {
  parameters: number[];
  standardErrors: number[];
  covariance: number[][];
  residualSumOfSquares: number;
  degreesOfFreedom: number;
  residualStandardDeviation: number;
  /** Library iterations plus polishing steps. */
  iterations: number;
  converged: boolean;
}

interface CheckedFitOptions {
  x: Float64Array;
  y: Float64Array;
  weights: Float64Array;
  model: ParameterizedModel;
  jacobian?: ParameterizedJacobian;
  initialParameters: number[];
  maxIterations: number;
  scaleCovarianceByResidualVariance: boolean;
}

export function checkLevenbergMarquardtFitOptions(options: LevenbergMarquardtFitOptions): CheckedFitOptions {
  const { x, y, model, initialParameters, weights, jacobian, maxIterations = 200, scaleCovarianceByResidualVariance = true } = options;
  if (!x || !y || typeof x.length !== 'number' || typeof y.length !== 'number') {
    throw new InvalidOptionError('Options x and y must both be arrays of numbers.');
  }
  if (x.length !== y.length) {
    throw new InvalidOptionError(`Options x and y must have the same length (x has ${x.length}, y has ${y.length}).`);
  }
  if (typeof model !== 'function') throw new InvalidOptionError('Option model must be a function of the parameters returning a function of x.');
  if (!Array.isArray(initialParameters) || initialParameters.length === 0 || !initialParameters.every(Number.isFinite)) {
    throw new InvalidOptionError('Option initialParameters must be a non-empty array of finite numbers.');
  }
  const parameterCount = initialParameters.length;
  if (x.length <= parameterCount) {
    throw new InvalidOptionError(
      `Options x and y need more points (${x.length}) than parameters (${parameterCount}) to leave degrees of freedom for the uncertainty.`,
    );
  }
  for (let i = 0; i < x.length; i++) {
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i])) {
      throw new InvalidOptionError(`Options x and y must be finite; point ${i + 1} is not.`);
    }
  }
  const checkedWeights = new Float64Array(x.length).fill(1);
  if (weights !== undefined) {
    if (weights.length !== x.length) {
      throw new InvalidOptionError(`Option weights must have one value per point (${x.length}), not ${weights.length}.`);
    }
    for (let i = 0; i < x.length; i++) {
      if (!(weights[i] > 0) || !Number.isFinite(weights[i])) {
        throw new InvalidOptionError(`Option weights must be positive and finite; point ${i + 1} has ${weights[i]}.`);
      }
      checkedWeights[i] = weights[i];
    }
  }
  if (!Number.isInteger(maxIterations) || maxIterations < 0) {
    throw new InvalidOptionError('Option maxIterations must be a non-negative integer.');
  }
  if (jacobian !== undefined && typeof jacobian !== 'function') {
    throw new InvalidOptionError('Option jacobian must be a function of the parameters returning a function of x.');
  }
  return {
    x: Float64Array.from(x),
    y: Float64Array.from(y),
    weights: checkedWeights,
    model,
    jacobian,
    initialParameters: initialParameters.slice(),
    maxIterations,
    scaleCovarianceByResidualVariance,
  };
}

const CUBE_ROOT_EPSILON = Math.cbrt(Number.EPSILON);

function weightedResidualSumOfSquares(parameters: number[], o: CheckedFitOptions): number {
  const f = o.model(parameters);
  let sum = 0;
  for (let i = 0; i < o.x.length; i++) {
    const r = o.y[i] - f(o.x[i]);
    sum += o.weights[i] * r * r;
  }
  return sum;
}

/** √W·J (n × p) at the parameters; central differences with step ∛ε·max(|θ|, typical). */
function weightedJacobian(parameters: number[], typicalMagnitude: number[], o: CheckedFitOptions): Matrix {
  const n = o.x.length;
  const p = parameters.length;
  const rows: Matrix = Array.from({ length: n }, () => new Array<number>(p));
  if (o.jacobian) {
    const gradient = o.jacobian(parameters);
    for (let i = 0; i < n; i++) {
      const partials = gradient(o.x[i]);
      const sw = Math.sqrt(o.weights[i]);
      for (let j = 0; j < p; j++) rows[i][j] = sw * partials[j];
    }
    return rows;
  }
  for (let j = 0; j < p; j++) {
    const step0 = CUBE_ROOT_EPSILON * Math.max(Math.abs(parameters[j]), typicalMagnitude[j]);
    const plus = parameters.slice();
    const minus = parameters.slice();
    plus[j] += step0;
    minus[j] -= step0;
    const step = plus[j] - minus[j]; // the representable step actually taken
    const fPlus = o.model(plus);
    const fMinus = o.model(minus);
    for (let i = 0; i < n; i++) {
      rows[i][j] = (Math.sqrt(o.weights[i]) * (fPlus(o.x[i]) - fMinus(o.x[i]))) / step;
    }
  }
  return rows;
}

function weightedResiduals(parameters: number[], o: CheckedFitOptions): number[] {
  const f = o.model(parameters);
  const out = new Array<number>(o.x.length);
  for (let i = 0; i < o.x.length; i++) out[i] = Math.sqrt(o.weights[i]) * (o.y[i] - f(o.x[i]));
  return out;
}

function runLibraryIterations(o: CheckedFitOptions, typicalMagnitude: number[]): { parameters: number[]; iterations: number } {
  if (o.maxIterations === 0) return { parameters: o.initialParameters.slice(), iterations: 0 };
  const scale = typicalMagnitude;
  const unscale = (q: number[]) => q.map((v, j) => v * scale[j]);
  const scaledModel = (q: number[]) => o.model(unscale(q));
  const scaledJacobian = (q: number[]) => {
    const parameters = unscale(q);
    if (o.jacobian) {
      const g = o.jacobian(parameters);
      return (x: number) => g(x).map((d, j) => d * scale[j]);
    }
    const perturbed: { plus: (x: number) => number; minus: (x: number) => number; step: number }[] = [];
    for (let j = 0; j < q.length; j++) {
      const plus = q.slice();
      const minus = q.slice();
      const h = CUBE_ROOT_EPSILON * Math.max(Math.abs(q[j]), 1);
      plus[j] += h;
      minus[j] -= h;
      perturbed.push({ plus: scaledModel(plus), minus: scaledModel(minus), step: plus[j] - minus[j] });
    }
    return (x: number) => perturbed.map(({ plus, minus, step }) => (plus(x) - minus(x)) / step);
  };
  // Damping relative to the size of JᵀWJ so that the first steps are neither pure Gauss–Newton nor frozen.
  const j0 = weightedJacobian(o.initialParameters, typicalMagnitude, o);
  let largestDiagonal = 0;
  for (let c = 0; c < o.initialParameters.length; c++) {
    let s = 0;
    for (const row of j0) s += (row[c] * scale[c]) ** 2;
    largestDiagonal = Math.max(largestDiagonal, s);
  }
  const damping = Number.isFinite(largestDiagonal) && largestDiagonal > 0 ? 1e-3 * largestDiagonal : 1e-2;
  try {
    const result = levenbergMarquardt({ x: o.x, y: o.y }, scaledModel, {
      initialValues: o.initialParameters.map((v, j) => v / scale[j]),
      // the library wants σ per point and squares its reciprocal
      weights: Array.from(o.weights, (w) => 1 / Math.sqrt(w)),
      damping,
      maxIterations: o.maxIterations,
      errorTolerance: 0,
      jacobianFunction: scaledJacobian,
    });
    const parameters = unscale(result.parameterValues);
    if (!parameters.every(Number.isFinite)) return { parameters: o.initialParameters.slice(), iterations: result.iterations };
    return { parameters, iterations: result.iterations };
  } catch {
    // A singular step inside the library: continue from the start with the polishing loop, which can damp harder.
    return { parameters: o.initialParameters.slice(), iterations: 0 };
  }
}

/**
 * Damped Gauss–Newton (Levenberg–Marquardt with Marquardt's diagonal
 * scaling), each step from QR of the augmented system [√W·J; √λ·D]·δ = [√W·r; 0].
 */
function polish(
  start: number[],
  typicalMagnitude: number[],
  o: CheckedFitOptions,
  maxSteps: number,
): { parameters: number[]; steps: number; converged: boolean } {
  let parameters = start.slice();
  let rss = weightedResidualSumOfSquares(parameters, o);
  const p = parameters.length;
  let lambda = 0;
  for (let stepIndex = 1; stepIndex <= maxSteps; stepIndex++) {
    const jacobian = weightedJacobian(parameters, typicalMagnitude, o);
    const residuals = weightedResiduals(parameters, o);
    const columnNorms = new Array<number>(p).fill(0);
    for (const row of jacobian) for (let j = 0; j < p; j++) columnNorms[j] += row[j] * row[j];
    let accepted = false;
    for (let attempt = 0; attempt < 40; attempt++) {
      const design = jacobian.map((row) => row.slice());
      const observations = residuals.slice();
      if (lambda > 0) {
        for (let j = 0; j < p; j++) {
          const row = new Array<number>(p).fill(0);
          row[j] = Math.sqrt(lambda * columnNorms[j]);
          design.push(row);
          observations.push(0);
        }
      }
      let delta: number[];
      try {
        delta = solveLeastSquares(design, observations).solution;
      } catch (error) {
        if (!(error instanceof SingularMatrixError)) throw error;
        lambda = lambda === 0 ? 1e-6 : lambda * 10;
        continue;
      }
      const candidate = parameters.map((v, j) => v + delta[j]);
      const candidateRss = weightedResidualSumOfSquares(candidate, o);
      if (Number.isFinite(candidateRss) && candidateRss <= rss) {
        const relativeStep = Math.max(...delta.map((d, j) => Math.abs(d) / Math.max(Math.abs(parameters[j]), 1e-6 * typicalMagnitude[j])));
        const rssChange = (rss - candidateRss) / Math.max(rss, Number.MIN_VALUE);
        parameters = candidate;
        rss = candidateRss;
        lambda = lambda * 0.1 < 1e-12 ? 0 : lambda * 0.1;
        accepted = true;
        if (relativeStep < 1e-11 || rssChange < 1e-15 || rss === 0) return { parameters, steps: stepIndex, converged: true };
        break;
      }
      lambda = lambda === 0 ? 1e-6 : lambda * 10;
      if (lambda > 1e12) break;
    }
    if (!accepted) {
      // No step lowers the sum of squares: the point is a minimum to working precision.
      return { parameters, steps: stepIndex, converged: lambda > 1e12 && Number.isFinite(rss) };
    }
  }
  return { parameters, steps: maxSteps, converged: false };
}

export function levenbergMarquardtFit(options: LevenbergMarquardtFitOptions): LevenbergMarquardtFitResult {
  const o = checkLevenbergMarquardtFitOptions(options);
  const typicalMagnitude = o.initialParameters.map((v) => (v !== 0 ? Math.abs(v) : 1));
  const library = runLibraryIterations(o, typicalMagnitude);
  let start = library.parameters;
  if (!(weightedResidualSumOfSquares(start, o) <= weightedResidualSumOfSquares(o.initialParameters, o))) {
    start = o.initialParameters.slice();
  }
  const polished = polish(start, typicalMagnitude, o, 100);
  const parameters = polished.parameters;

  const n = o.x.length;
  const p = parameters.length;
  const degreesOfFreedom = n - p;
  const residualSumOfSquares = weightedResidualSumOfSquares(parameters, o);
  const residualVariance = residualSumOfSquares / degreesOfFreedom;

  let covariance: number[][];
  try {
    const { inverseNormalMatrix } = solveLeastSquares(weightedJacobian(parameters, typicalMagnitude, o), new Array(n).fill(0));
    const factor = o.scaleCovarianceByResidualVariance ? residualVariance : 1;
    covariance = inverseNormalMatrix.map((row) => row.map((v) => v * factor));
  } catch (error) {
    if (!(error instanceof SingularMatrixError)) throw error;
    covariance = Array.from({ length: p }, () => new Array<number>(p).fill(NaN));
  }
  const standardErrors = covariance.map((row, j) => Math.sqrt(row[j]));
  return {
    parameters,
    standardErrors,
    covariance,
    residualSumOfSquares,
    degreesOfFreedom,
    residualStandardDeviation: Math.sqrt(residualVariance),
    iterations: library.iterations + polished.steps,
    converged: polished.converged && standardErrors.every(Number.isFinite),
  };
}
