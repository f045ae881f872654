import { InvalidOptionError } from '../fit/invalid-option-error';

/** One input quantity of a measurement model (JCGM 100:2008 §4). */
export interface GumInput {
  name: string;
  value: number;
  standardUncertainty: number;
  unit: string;
  /** Degrees of freedom of the standard uncertainty (default Infinity: known exactly, e.g. Type B). */
  degreesOfFreedom?: number;
}

export function checkGumInputs(inputs: GumInput[]): Required<GumInput>[] {
  if (!Array.isArray(inputs) || inputs.length === 0) {
    throw new InvalidOptionError('Option inputs must be a non-empty array of input quantities.');
  }
  const seen = new Set<string>();
  return inputs.map((input, i) => {
    const label = input && typeof input.name === 'string' && input.name ? `"${input.name}"` : `number ${i + 1}`;
    if (!input || typeof input.name !== 'string' || input.name.trim() === '') {
      throw new InvalidOptionError(`Input number ${i + 1} needs a name.`);
    }
    if (seen.has(input.name)) throw new InvalidOptionError(`Input name ${label} is used twice; each input needs its own name.`);
    seen.add(input.name);
    if (!Number.isFinite(input.value)) throw new InvalidOptionError(`Input ${label} has a value that is not a finite number.`);
    if (!(input.standardUncertainty >= 0) || !Number.isFinite(input.standardUncertainty)) {
      throw new InvalidOptionError(`Input ${label} needs a standard uncertainty that is zero or positive and finite.`);
    }
    if (typeof input.unit !== 'string') throw new InvalidOptionError(`Input ${label} needs a unit (an empty string for a pure number).`);
    const degreesOfFreedom = input.degreesOfFreedom ?? Infinity;
    if (!(degreesOfFreedom > 0)) {
      throw new InvalidOptionError(`Input ${label} needs positive degrees of freedom (or Infinity), not ${degreesOfFreedom}.`);
    }
    return { name: input.name, value: input.value, standardUncertainty: input.standardUncertainty, unit: input.unit, degreesOfFreedom };
  });
}

/** Checks a correlation matrix for the inputs: square, symmetric, unit diagonal, entries in [−1, 1]. */
export function checkCorrelation(correlation: number[][] | undefined, inputCount: number): number[][] | null {
  if (correlation === undefined) return null;
  if (!Array.isArray(correlation) || correlation.length !== inputCount || correlation.some((row) => !Array.isArray(row) || row.length !== inputCount)) {
    throw new InvalidOptionError(`Option correlation must be a ${inputCount} × ${inputCount} matrix, one row and column per input.`);
  }
  for (let i = 0; i < inputCount; i++) {
    if (Math.abs(correlation[i][i] - 1) > 1e-12) throw new InvalidOptionError(`Option correlation must have 1 on its diagonal (row ${i + 1} has ${correlation[i][i]}).`);
    for (let j = 0; j < inputCount; j++) {
      const r = correlation[i][j];
      if (!(Math.abs(r) <= 1)) throw new InvalidOptionError(`Option correlation entries must lie between −1 and 1 (row ${i + 1}, column ${j + 1} has ${r}).`);
      if (Math.abs(r - correlation[j][i]) > 1e-12) throw new InvalidOptionError(`Option correlation must be symmetric (rows ${i + 1} and ${j + 1} differ).`);
    }
  }
  return correlation;
}
