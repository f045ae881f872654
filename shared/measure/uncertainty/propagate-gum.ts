/**
 * Law of propagation of uncertainty (JCGM 100:2008 §5), first order, with
 * sensitivity coefficients by central differences, effective degrees of
 * freedom by Welch–Satterthwaite (G.4.1) and k from Student's t (G.3).
 */
import type { BudgetRow } from '../types';
import { InvalidOptionError } from '../fit/invalid-option-error';
import { checkCorrelation, checkGumInputs, type GumInput } from './gum-input';
import { coverageFactorFor } from './student-t';

export type { GumInput } from './gum-input';

export interface PropagateGumOptions {
  inputs: GumInput[];
  /** The measurement model; receives the input values in the order of `inputs`. */
  model: (values: number[]) => number;
  /** Correlation coefficients r(xᵢ, xⱼ); absent means independent inputs. */
  correlation?: number[][];
  coverageProbability?: number;
  outputUnit?: string;
  /**
   * How ν_eff becomes the t quantile's degrees of freedom: 'truncate' (default)
   * to the next lower integer as JCGM 100:2008 G.4.1 allows, or 'none'.
   */
  degreesOfFreedomRounding?: 'truncate' | 'none';
}

export interface PropagateGumResult {
  value: number;
  combinedStandardUncertainty: number;
  effectiveDegreesOfFreedom: number;
  coverageFactor: number;
  expandedUncertainty: number;
  coverageProbability: number;
  outputUnit: string;
  /** One row per input, in input order. varianceShare = (cᵢuᵢ)²/u_c², so with correlated inputs the shares need not sum to 1. */
  budget: BudgetRow[];
}

/** Step for the central difference: a hundredth of u, not below what double rounding allows; relative when u = 0. */
function sensitivityStep(value: number, standardUncertainty: number): number {
  const roundingFloor = 1e-10 * Math.abs(value);
  if (standardUncertainty > 0) return Math.max(standardUncertainty / 100, roundingFloor);
  return value !== 0 ? 1e-6 * Math.abs(value) : 1e-6;
}

export function checkPropagateGumOptions(options: PropagateGumOptions) {
  const inputs = checkGumInputs(options.inputs);
  if (typeof options.model !== 'function') throw new InvalidOptionError('Option model must be a function of the input values.');
  const correlation = checkCorrelation(options.correlation, inputs.length);
  const coverageProbability = options.coverageProbability ?? 0.95;
  if (!(coverageProbability > 0 && coverageProbability < 1)) {
    throw new InvalidOptionError(`Option coverageProbability must lie strictly between 0 and 1 (got ${coverageProbability}).`);
  }
  const degreesOfFreedomRounding = options.degreesOfFreedomRounding ?? 'truncate';
  if (degreesOfFreedomRounding !== 'truncate' && degreesOfFreedomRounding !== 'none') {
    throw new InvalidOptionError("Option degreesOfFreedomRounding must be 'truncate' or 'none'.");
  }
  return { inputs, model: options.model, correlation, coverageProbability, outputUnit: options.outputUnit ?? '', degreesOfFreedomRounding };
}

export function propagateGum(options: PropagateGumOptions): PropagateGumResult {
  const { inputs, model, correlation, coverageProbability, outputUnit, degreesOfFreedomRounding } = checkPropagateGumOptions(options);
  const values = inputs.map((input) => input.value);
  const value = model(values.slice());
  if (!Number.isFinite(value)) throw new InvalidOptionError('Option model returned a value that is not finite at the input values.');

  const sensitivities = inputs.map((input, i) => {
    const step = sensitivityStep(input.value, input.standardUncertainty);
    const plus = values.slice();
    const minus = values.slice();
    plus[i] += step;
    minus[i] -= step;
    const derivative = (model(plus) - model(minus)) / (plus[i] - minus[i]);
    if (!Number.isFinite(derivative)) {
      throw new InvalidOptionError(`Option model is not finite near input "${input.name}", so its sensitivity cannot be found.`);
    }
    return derivative;
  });
  const contributions = inputs.map((input, i) => sensitivities[i] * input.standardUncertainty);

  let combinedVariance = 0;
  for (let i = 0; i < inputs.length; i++) {
    combinedVariance += contributions[i] ** 2;
    if (correlation) {
      for (let j = i + 1; j < inputs.length; j++) combinedVariance += 2 * contributions[i] * contributions[j] * correlation[i][j];
    }
  }
  // Strongly anti-correlated inputs can leave a tiny negative round-off.
  combinedVariance = Math.max(combinedVariance, 0);
  const combinedStandardUncertainty = Math.sqrt(combinedVariance);

  let welchSatterthwaiteDenominator = 0;
  inputs.forEach((input, i) => {
    if (Number.isFinite(input.degreesOfFreedom)) welchSatterthwaiteDenominator += contributions[i] ** 4 / input.degreesOfFreedom;
  });
  const effectiveDegreesOfFreedom =
    welchSatterthwaiteDenominator > 0 ? combinedVariance ** 2 / welchSatterthwaiteDenominator : Infinity;
  const degreesForQuantile =
    degreesOfFreedomRounding === 'truncate' && Number.isFinite(effectiveDegreesOfFreedom)
      ? Math.max(1, Math.floor(effectiveDegreesOfFreedom))
      : effectiveDegreesOfFreedom;
  const coverageFactor = coverageFactorFor({ degreesOfFreedom: degreesForQuantile, coverageProbability });

  const budget: BudgetRow[] = inputs.map((input, i) => ({
    source: input.name,
    value: input.value,
    unit: input.unit,
    standardUncertainty: input.standardUncertainty,
    degreesOfFreedom: input.degreesOfFreedom,
    sensitivity: sensitivities[i],
    contributionMm: Math.abs(contributions[i]),
    varianceShare: combinedVariance > 0 ? contributions[i] ** 2 / combinedVariance : 0,
  }));

  return {
    value,
    combinedStandardUncertainty,
    effectiveDegreesOfFreedom,
    coverageFactor,
    expandedUncertainty: coverageFactor * combinedStandardUncertainty,
    coverageProbability,
    outputUnit,
    budget,
  };
}
