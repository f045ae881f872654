import type { GumInput } from '../uncertainty/gum-input';
import { propagateMonteCarlo } from '../uncertainty/propagate-monte-carlo';
import { numericalToleranceFor } from '../uncertainty/compare-gum-with-monte-carlo';

export interface MonteCarloCrossCheck {
  draws: number;
  value: number;
  standardUncertainty: number;
  intervalLow: number;
  intervalHigh: number;
  /** Standard deviation of the interval ends over the batches, divided by √h (JCGM 101:2008 §7.9.4). */
  endpointStandardDeviation: number;
  numericalTolerance: number;
  dLow: number;
  dHigh: number;
  agrees: boolean;
}

/**
 * Monte Carlo propagation (JCGM 101:2008) run as h batches, so that the
 * simulation's own scatter in the interval ends is known (§7.9.4), then the
 * §8 comparison with the GUM interval. A difference is called a
 * disagreement only when it exceeds both the numerical tolerance δ and
 * twice that scatter: below it, more draws, not a nonlinear model, would be
 * needed to tell.
 */
export function monteCarloCrossCheck(options: {
  inputs: GumInput[];
  model: (values: number[]) => number;
  gum: { value: number; combinedStandardUncertainty: number; expandedUncertainty: number };
  draws: number;
  seed: number;
  batches?: number;
}): MonteCarloCrossCheck {
  const batches = options.batches ?? 10;
  const perBatch = Math.max(1000, Math.ceil(options.draws / batches));
  const runs = Array.from({ length: batches }, (_, b) =>
    propagateMonteCarlo({ inputs: options.inputs, model: options.model, draws: perBatch, seed: options.seed + 7919 * b }),
  );
  const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;
  const spread = (xs: number[]) => {
    const m = mean(xs);
    return Math.sqrt(xs.reduce((s, x) => s + (x - m) ** 2, 0) / (xs.length - 1) / xs.length);
  };
  const lows = runs.map((r) => r.intervalLow);
  const highs = runs.map((r) => r.intervalHigh);
  const intervalLow = mean(lows);
  const intervalHigh = mean(highs);
  const endpointStandardDeviation = Math.max(spread(lows), spread(highs));
  const numericalTolerance = numericalToleranceFor(options.gum.combinedStandardUncertainty, 2);
  const dLow = Math.abs(options.gum.value - options.gum.expandedUncertainty - intervalLow);
  const dHigh = Math.abs(options.gum.value + options.gum.expandedUncertainty - intervalHigh);
  const limit = Math.max(numericalTolerance, 2 * endpointStandardDeviation);
  return {
    draws: perBatch * batches,
    value: mean(runs.map((r) => r.value)),
    standardUncertainty: Math.sqrt(mean(runs.map((r) => r.standardUncertainty ** 2))),
    intervalLow,
    intervalHigh,
    endpointStandardDeviation,
    numericalTolerance,
    dLow,
    dHigh,
    agrees: dLow <= limit && dHigh <= limit,
  };
}
