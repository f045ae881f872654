/**
 * Decision rules for a statement of conformity to a tolerance
 * (ILAC-G8:09/2019 §4; JCGM 106:2012 §8):
 * - simple acceptance: conforms when the measured value lies inside the
 *   tolerance limits (limits included), otherwise does not conform;
 * - guarded acceptance with guard band w = U: conforms inside
 *   [lower + U, upper − U], does not conform outside [lower − U, upper + U],
 *   undecided in between (the uncertainty is too large to say).
 */
import { InvalidOptionError } from '../fit/invalid-option-error';

export { toleranceLimits, type ToleranceLimitsOptions } from './tolerance-limits';

export type DecisionRule = 'simple' | 'guarded';
export type ConformityDecision = 'conforms' | 'does-not-conform' | 'undecided';

export interface DecideConformityOptions {
  measuredValue: number;
  /** Expanded uncertainty U (same unit as the value). */
  expandedUncertainty: number;
  lowerLimit: number;
  upperLimit: number;
  rule: DecisionRule;
  /** Unit printed in the statement (default 'mm'). */
  unit?: string;
}

export interface ConformityResult {
  decision: ConformityDecision;
  rule: DecisionRule;
  /** Values in [acceptanceLower, acceptanceUpper] conform; the interval is empty when acceptanceLower > acceptanceUpper. */
  acceptanceLower: number;
  acceptanceUpper: number;
  /** Values below rejectionLower or above rejectionUpper do not conform. */
  rejectionLower: number;
  rejectionUpper: number;
  statement: string;
}

export function checkDecideConformityOptions(options: DecideConformityOptions): Required<DecideConformityOptions> {
  const { measuredValue, expandedUncertainty, lowerLimit, upperLimit, rule, unit = 'mm' } = options;
  if (!Number.isFinite(measuredValue)) throw new InvalidOptionError('Option measuredValue must be a finite number.');
  if (!(expandedUncertainty >= 0) || !Number.isFinite(expandedUncertainty)) {
    throw new InvalidOptionError('Option expandedUncertainty must be zero or a positive finite number.');
  }
  if (!Number.isFinite(lowerLimit) || !Number.isFinite(upperLimit)) throw new InvalidOptionError('Options lowerLimit and upperLimit must be finite numbers.');
  if (!(lowerLimit < upperLimit)) throw new InvalidOptionError(`Option lowerLimit (${lowerLimit}) must be below upperLimit (${upperLimit}).`);
  if (rule !== 'simple' && rule !== 'guarded') throw new InvalidOptionError(`Option rule must be 'simple' or 'guarded' (got '${rule}').`);
  return { measuredValue, expandedUncertainty, lowerLimit, upperLimit, rule, unit };
}

/** U to two significant digits and the value to the same decimal place (GUM 7.2.6). */
function roundedToUncertainty(value: number, expandedUncertainty: number): [string, string] {
  if (!(expandedUncertainty > 0) || !Number.isFinite(expandedUncertainty)) return [format(value), format(expandedUncertainty)];
  const decimals = Math.min(12, Math.max(0, 1 - Math.floor(Math.log10(expandedUncertainty))));
  return [value.toFixed(decimals), expandedUncertainty.toFixed(decimals)];
}

function format(value: number): string {
  return Number(value.toPrecision(6)).toString();
}

export function decideConformity(options: DecideConformityOptions): ConformityResult {
  const { measuredValue, expandedUncertainty, lowerLimit, upperLimit, rule, unit } = checkDecideConformityOptions(options);
  const guardBand = rule === 'guarded' ? expandedUncertainty : 0;
  const acceptanceLower = lowerLimit + guardBand;
  const acceptanceUpper = upperLimit - guardBand;
  const rejectionLower = lowerLimit - guardBand;
  const rejectionUpper = upperLimit + guardBand;

  let decision: ConformityDecision;
  if (measuredValue >= acceptanceLower && measuredValue <= acceptanceUpper) decision = 'conforms';
  else if (measuredValue < rejectionLower || measuredValue > rejectionUpper) decision = 'does-not-conform';
  else decision = 'undecided';
  if (rule === 'simple' && decision === 'undecided') decision = 'does-not-conform';

  const tolerance = `${format(lowerLimit)} to ${format(upperLimit)} ${unit}`;
  const [valueText, uncertaintyText] = roundedToUncertainty(measuredValue, expandedUncertainty);
  const measured = `${valueText} ${unit} (U = ${uncertaintyText} ${unit})`;
  let statement: string;
  if (rule === 'simple') {
    statement =
      decision === 'conforms'
        ? `Under simple acceptance the measured ${measured} lies within the tolerance ${tolerance}, so the item conforms; the uncertainty is not used as a guard band.`
        : `Under simple acceptance the measured ${measured} lies outside the tolerance ${tolerance}, so the item does not conform; the uncertainty is not used as a guard band.`;
  } else if (decision === 'conforms') {
    statement = `Under guarded acceptance (guard band equal to U) the measured ${measured} lies within the tolerance ${tolerance} by at least U, so the item conforms.`;
  } else if (decision === 'does-not-conform') {
    statement = `Under guarded acceptance (guard band equal to U) the measured ${measured} lies outside the tolerance ${tolerance} by more than U, so the item does not conform.`;
  } else {
    statement = `Under guarded acceptance (guard band equal to U) the measured ${measured} lies within U of a limit of the tolerance ${tolerance}, so conformity cannot be decided at this uncertainty.`;
  }
  return { decision, rule, acceptanceLower, acceptanceUpper, rejectionLower, rejectionUpper, statement };
}
