import type { GumInput } from '../uncertainty/gum-input';

/**
 * Collects the inputs of a measurement model (GUM, JCGM 100:2008 §4) and hands
 * out their positions in the value vector the model function receives.
 */
export class InputSet {
  readonly inputs: GumInput[] = [];

  add(input: { name: string; value: number; standardUncertainty: number; unit: string; degreesOfFreedom?: number }): number {
    this.inputs.push({
      name: input.name,
      value: input.value,
      standardUncertainty: Math.max(0, input.standardUncertainty),
      unit: input.unit,
      degreesOfFreedom: input.degreesOfFreedom ?? Infinity,
    });
    return this.inputs.length - 1;
  }

  get values(): number[] {
    return this.inputs.map((i) => i.value);
  }
}
