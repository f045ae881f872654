import type { TargetPolarity } from '../types';

/** The polarity most frames show; a tie counts as dark-on-light. */
export function majorityPolarity(values: TargetPolarity[]): TargetPolarity {
  const dark = values.filter((v) => v === 'dark-on-light').length;
  return dark * 2 >= values.length ? 'dark-on-light' : 'light-on-dark';
}
