import type { DecisionRule } from '@shared/schemas/work-orders';

/** Decision rules for conformity statements, as ILAC-G8:09/2019 names them. */
export const DECISION_RULE_CHOICES: { value: DecisionRule; label: string; explanation: string }[] = [
  {
    value: 'simple',
    label: 'Simple acceptance',
    explanation: 'A lens whose measured focal length lies inside the tolerance conforms; the uncertainty is reported but not used as a guard band.',
  },
  {
    value: 'guarded',
    label: 'Guarded acceptance (w = U)',
    explanation: 'Conforms only inside the tolerance narrowed by U, fails outside it widened by U, and is undecided in between.',
  },
];

export const DECISION_RULE_SHORT: Record<DecisionRule, string> = {
  simple: 'Simple acceptance',
  guarded: 'Guarded, w = U',
};
