/**
 * Validation of the GUM result by Monte Carlo, JCGM 101:2008 §8: the GUM
 * interval y ± U_p is accepted when both its ends lie within the numerical
 * tolerance δ of the Monte Carlo interval's ends. δ = ½·10^l where u(y),
 * written with n_dig significant digits, is c × 10^l (7.9.2); u(y) is the GUM
 * standard uncertainty (from memory of §8.1).
 */
import { InvalidOptionError } from '../fit/invalid-option-error';

export interface CompareGumWithMonteCarloOptions {
  gum: { value: number; combinedStandardUncertainty: number; expandedUncertainty: number };
  monteCarlo: { intervalLow: number; intervalHigh: number };
  significantDigits?: number;
}

export interface CompareGumWithMonteCarloResult {
  agrees: boolean;
  numericalTolerance: number;
  dLow: number;
  dHigh: number;
}

/** δ = ½·10^l with u = c × 10^l and c an integer of `significantDigits` digits. */
export function numericalToleranceFor(standardUncertainty: number, significantDigits: number): number {
  if (!(standardUncertainty > 0)) return 0;
  let exponent = Math.floor(Math.log10(standardUncertainty)) - (significantDigits - 1);
  // Rounding can carry into one more digit (0.0996 with 2 digits is 10 × 10⁻², not 99.6 × 10⁻³).
  if (Math.round(standardUncertainty / 10 ** exponent) >= 10 ** significantDigits) exponent += 1;
  return 0.5 * 10 ** exponent;
}

export function compareGumWithMonteCarlo(options: CompareGumWithMonteCarloOptions): CompareGumWithMonteCarloResult {
  const { gum, monteCarlo, significantDigits = 2 } = options;
  if (!Number.isInteger(significantDigits) || significantDigits < 1) {
    throw new InvalidOptionError(`Option significantDigits must be a positive integer (got ${significantDigits}).`);
  }
  const numericalTolerance = numericalToleranceFor(gum.combinedStandardUncertainty, significantDigits);
  const dLow = Math.abs(gum.value - gum.expandedUncertainty - monteCarlo.intervalLow);
  const dHigh = Math.abs(gum.value + gum.expandedUncertainty - monteCarlo.intervalHigh);
  return { agrees: dLow <= numericalTolerance && dHigh <= numericalTolerance, numericalTolerance, dLow, dHigh };
}
