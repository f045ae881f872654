import type { MeasurementMethod } from '@shared/measure/types';

export const METHOD_WORDS: Record<MeasurementMethod, string> = {
  'finite-conjugate': 'Finite conjugates (lens equation and magnification)',
  'multi-conjugate': 'Several conjugates (thick lens, principal planes)',
  displacement: 'Displacement (Bessel)',
  collimator: 'Collimator (object at infinity)',
  'auxiliary-lens': 'In contact with an auxiliary lens',
};

export const DECISION_RULE_WORDS: Record<'simple' | 'guarded', string> = {
  simple: 'Simple acceptance: inside the tolerance conforms; U is not used as a guard band (ILAC-G8:09/2019).',
  guarded: 'Guarded acceptance with guard band w = U: conforms inside the tolerance narrowed by U, does not conform outside it widened by U, undecided between (ILAC-G8:09/2019).',
};
