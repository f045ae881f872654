/**
 * How numbers are printed on a certificate. An expanded uncertainty is given
 * to two significant digits and the value to the same decimal place
 * (JCGM 100:2008 §7.2.6); rounding is to nearest, not upward.
 */
import { InvalidOptionError } from '../../shared/measure/fit/invalid-option-error';

const MINUS = '\u2212';

function withMinusSign(text: string): string {
  return text.startsWith('-') ? `${MINUS}${text.slice(1)}` : text;
}

/** value rounded at `decimals` places (negative: to tens, hundreds…), typographic minus, no "-0". */
export function formatAtDecimals(value: number, decimals: number): string {
  const rounded = decimals >= 0 ? value.toFixed(decimals) : (Math.round(value / 10 ** -decimals) * 10 ** -decimals).toFixed(0);
  return withMinusSign(/^-0(\.0*)?$/.test(rounded) ? rounded.slice(1) : rounded);
}

/** Decimal places that show `uncertainty` with `significantDigits` digits after rounding. */
export function decimalsForUncertainty(uncertainty: number, significantDigits = 2): number {
  if (!(uncertainty > 0) || !Number.isFinite(uncertainty)) {
    throw new InvalidOptionError(`Option uncertainty must be a positive finite number (got ${uncertainty}).`);
  }
  let decimals = significantDigits - 1 - Math.floor(Math.log10(uncertainty));
  // 0.0996 to two digits rounds up to 0.100: one decimal fewer keeps two digits.
  if (Math.abs(Number(formatAtDecimals(uncertainty, decimals))) >= 10 ** (significantDigits - decimals)) decimals -= 1;
  return decimals;
}

export interface MeasuredValueText {
  valueText: string;
  uncertaintyText: string;
  decimals: number;
}

/** A value and its uncertainty, the uncertainty to two significant digits and the value to match. */
export function formatMeasuredValue(options: { value: number; uncertainty: number; significantDigits?: number }): MeasuredValueText {
  const { value, uncertainty, significantDigits = 2 } = options;
  if (!Number.isFinite(value)) throw new InvalidOptionError(`Option value must be a finite number (got ${value}).`);
  const decimals = decimalsForUncertainty(uncertainty, significantDigits);
  return { valueText: formatAtDecimals(value, decimals), uncertaintyText: formatAtDecimals(uncertainty, decimals), decimals };
}

/** `digits` significant digits (2914.6 to two is "2900"), no exponent for ordinary magnitudes; typographic minus. */
export function formatSignificant(value: number, digits: number): string {
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude < 1e-4 || magnitude >= 1e9) {
    const [mantissa, exponent] = value.toExponential(digits - 1).split('e');
    return `${withMinusSign(mantissa)}e${withMinusSign(exponent.replace('+', ''))}`;
  }
  return formatAtDecimals(value, digits - 1 - Math.floor(Math.log10(magnitude)));
}

/** A probability 0..1 as a percentage with at most two decimals, trailing zeros dropped ("95", "95.45"). */
export function formatPercent(fraction: number): string {
  return withMinusSign(String(Number((fraction * 100).toFixed(2))));
}
