/**
 * Propagation of distributions by Monte Carlo (JCGM 101:2008 §7): Gaussian
 * inputs, or scaled-and-shifted t for inputs with finite degrees of freedom
 * (6.4.9); probabilistically symmetric coverage interval from the order
 * statistics (7.7.2). Only the output values are kept (one Float64Array).
 */
import { InvalidOptionError } from '../fit/invalid-option-error';
import { choleskyDecompose, SingularMatrixError } from '../fit/dense-linear-algebra';
import { checkCorrelation, checkGumInputs, type GumInput } from './gum-input';
import { createSeededRandom } from './seeded-random';
import { selectInPlace } from '../statistics/select-in-place';

export { compareGumWithMonteCarlo } from './compare-gum-with-monte-carlo';

export interface PropagateMonteCarloOptions {
  inputs: GumInput[];
  /** The measurement model; it is handed one array, refilled for every trial, so it must not keep it. */
  model: (values: number[]) => number;
  /** Number of trials M (default 1e5). */
  draws?: number;
  seed?: number;
  coverageProbability?: number;
  /** Correlation of Gaussian inputs (inputs with finite degrees of freedom must be uncorrelated). */
  correlation?: number[][];
}

export interface PropagateMonteCarloResult {
  /** Mean of the model values. */
  value: number;
  /** Standard deviation of the model values. */
  standardUncertainty: number;
  intervalLow: number;
  intervalHigh: number;
  coverageProbability: number;
  draws: number;
}

export function checkPropagateMonteCarloOptions(options: PropagateMonteCarloOptions) {
  const inputs = checkGumInputs(options.inputs);
  if (typeof options.model !== 'function') throw new InvalidOptionError('Option model must be a function of the input values.');
  const draws = options.draws ?? 100_000;
  if (!Number.isInteger(draws) || draws < 100) throw new InvalidOptionError(`Option draws must be an integer of at least 100 (got ${draws}).`);
  const seed = options.seed ?? 1;
  if (!Number.isFinite(seed)) throw new InvalidOptionError('Option seed must be a finite number.');
  const coverageProbability = options.coverageProbability ?? 0.95;
  if (!(coverageProbability > 0 && coverageProbability < 1)) {
    throw new InvalidOptionError(`Option coverageProbability must lie strictly between 0 and 1 (got ${coverageProbability}).`);
  }
  const correlation = checkCorrelation(options.correlation, inputs.length);
  if (correlation) {
    for (let i = 0; i < inputs.length; i++) {
      for (let j = 0; j < inputs.length; j++) {
        if (i !== j && correlation[i][j] !== 0 && Number.isFinite(inputs[i].degreesOfFreedom)) {
          throw new InvalidOptionError(
            `Input "${inputs[i].name}" has finite degrees of freedom and a correlation; Monte Carlo here correlates Gaussian inputs only.`,
          );
        }
      }
    }
  }
  return { inputs, model: options.model, draws, seed, coverageProbability, correlation };
}

export function propagateMonteCarlo(options: PropagateMonteCarloOptions): PropagateMonteCarloResult {
  const { inputs, model, draws, seed, coverageProbability, correlation } = checkPropagateMonteCarloOptions(options);
  const random = createSeededRandom(seed);
  const n = inputs.length;
  let lower: number[][] | null = null;
  let scale: number[] | null = null;
  if (correlation) {
    try {
      ({ lower, scale } = choleskyDecompose(correlation));
    } catch (error) {
      if (error instanceof SingularMatrixError) {
        throw new InvalidOptionError('Option correlation is not positive definite, so no joint distribution can be drawn from it.');
      }
      throw error;
    }
  }
  const outputs = new Float64Array(draws);
  const means = Float64Array.from(inputs, (input) => input.value);
  const standardUncertainties = Float64Array.from(inputs, (input) => input.standardUncertainty);
  // Every input's standard deviates for all trials first, one array per input (filled in one loop each).
  const deviates = inputs.map((input) => {
    const column = new Float64Array(draws);
    random.fillStudentT(column, input.degreesOfFreedom);
    return column;
  });
  // One array handed to the model on every trial (the model reads it, never keeps it): a fresh one per trial was most of the loop's cost.
  const values = inputs.map((input) => input.value);
  // Welford's running mean and variance (stable for large M).
  let mean = 0;
  let sumSquaredDeviations = 0;
  for (let trial = 0; trial < draws; trial++) {
    for (let i = 0; i < n; i++) {
      let deviate = deviates[i][trial];
      if (lower && scale) {
        // correlation has unit diagonal, so the Jacobi scale is 1 and L·z has the right correlation
        deviate = 0;
        for (let k = 0; k <= i; k++) deviate += lower[i][k] * deviates[k][trial];
      }
      values[i] = means[i] + standardUncertainties[i] * deviate;
    }
    const y = model(values);
    if (!Number.isFinite(y)) {
      throw new InvalidOptionError(`Option model returned a non-finite value at Monte Carlo trial ${trial + 1}; the inputs' spread reaches where the model is undefined.`);
    }
    outputs[trial] = y;
    const delta = y - mean;
    mean += delta / (trial + 1);
    sumSquaredDeviations += delta * (y - mean);
  }
  const q = Number.isInteger(coverageProbability * draws) ? coverageProbability * draws : Math.floor(coverageProbability * draws + 0.5);
  const r = (draws - q) % 2 === 0 ? (draws - q) / 2 : (draws - q + 1) / 2;
  const lowIndex = Math.max(r, 1) - 1;
  const highIndex = Math.min(r + q, draws) - 1;
  // Only two order statistics are needed, so they are selected rather than the whole sample sorted.
  const intervalLow = selectInPlace(outputs, lowIndex);
  const intervalHigh = selectInPlace(outputs, highIndex);
  return {
    value: mean,
    standardUncertainty: Math.sqrt(sumSquaredDeviations / (draws - 1)),
    intervalLow,
    intervalHigh,
    coverageProbability,
    draws,
  };
}
