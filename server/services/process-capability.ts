import { InvalidOptionError } from '../../shared/measure/fit/invalid-option-error';

export interface ProcessCapabilityOptions {
  /** Measured values, at least two. */
  valuesMm: readonly number[];
  lowerLimitMm: number;
  upperLimitMm: number;
}

export interface ProcessCapability {
  count: number;
  meanMm: number;
  /** Sample standard deviation (n − 1 in the denominator). */
  standardDeviationMm: number;
  /** (USL − LSL) / (6 s); null when s is zero. */
  cp: number | null;
  /** min(USL − mean, mean − LSL) / (3 s); null when s is zero. */
  cpk: number | null;
}

export function checkProcessCapabilityOptions(options: ProcessCapabilityOptions): ProcessCapabilityOptions {
  const { valuesMm, lowerLimitMm, upperLimitMm } = options;
  if (!Array.isArray(valuesMm) || valuesMm.length < 2) {
    throw new InvalidOptionError('Option valuesMm must hold at least two measured values.');
  }
  const bad = valuesMm.findIndex((value) => typeof value !== 'number' || !Number.isFinite(value));
  if (bad >= 0) throw new InvalidOptionError(`Option valuesMm must hold finite numbers (item ${bad} is ${valuesMm[bad]}).`);
  if (!Number.isFinite(lowerLimitMm)) throw new InvalidOptionError(`Option lowerLimitMm must be a finite number (got ${lowerLimitMm}).`);
  if (!Number.isFinite(upperLimitMm)) throw new InvalidOptionError(`Option upperLimitMm must be a finite number (got ${upperLimitMm}).`);
  if (!(upperLimitMm > lowerLimitMm)) {
    throw new InvalidOptionError(`Option upperLimitMm (${upperLimitMm}) must be greater than lowerLimitMm (${lowerLimitMm}).`);
  }
  return options;
}

/**
 * Process capability of a batch against its tolerance band. The mean and
 * standard deviation use Welford's one-pass update, which does not lose
 * precision when the spread is tiny beside the mean (a few µm on 100 mm).
 */
export function processCapability(options: ProcessCapabilityOptions): ProcessCapability {
  const { valuesMm, lowerLimitMm, upperLimitMm } = checkProcessCapabilityOptions(options);
  let meanMm = 0;
  let sumOfSquaredDeviations = 0;
  valuesMm.forEach((value, index) => {
    const delta = value - meanMm;
    meanMm += delta / (index + 1);
    sumOfSquaredDeviations += delta * (value - meanMm);
  });
  const count = valuesMm.length;
  const standardDeviationMm = Math.sqrt(sumOfSquaredDeviations / (count - 1));
  if (standardDeviationMm === 0) return { count, meanMm, standardDeviationMm, cp: null, cpk: null };
  return {
    count,
    meanMm,
    standardDeviationMm,
    cp: (upperLimitMm - lowerLimitMm) / (6 * standardDeviationMm),
    cpk: Math.min(upperLimitMm - meanMm, meanMm - lowerLimitMm) / (3 * standardDeviationMm),
  };
}
