/**
 * Turns a number (and optionally its uncertainty) into the text Paraxia
 * prints: fixed decimals, a true minus sign, and a spoken form for screen
 * readers. Layout (lighter unit, tabular figures) is the Quantity component's job.
 */

export interface FormatQuantityOptions {
  value: number;
  unit?: string;
  /** Expanded uncertainty in the same unit; printed as "± U". */
  uncertainty?: number;
  /** Decimals for value and uncertainty. Default: enough to show U to two significant digits, else 2. */
  digits?: number;
}

export interface FormattedQuantity {
  valueText: string;
  uncertaintyText: string | null;
  unit: string;
  digits: number;
  /** e.g. "99.93 plus or minus 0.12 millimetres". */
  spokenText: string;
}

const MAX_DIGITS = 12;
const MINUS_SIGN = '\u2212';
export const MISSING_VALUE_TEXT = '—';

const SPOKEN_UNITS: Record<string, string> = {
  mm: 'millimetres',
  µm: 'micrometres',
  um: 'micrometres',
  nm: 'nanometres',
  m: 'metres',
  ms: 'milliseconds',
  s: 'seconds',
  D: 'dioptres',
  'm⁻¹': 'dioptres',
  px: 'pixels',
  '%': 'percent',
  '°C': 'degrees Celsius',
  '%RH': 'percent relative humidity',
};

/** Decimals that show an uncertainty to two significant digits (GUM, JCGM 100:2008, 7.2.6). */
export function digitsForUncertainty(uncertainty: number): number {
  if (!(uncertainty > 0) || !Number.isFinite(uncertainty)) return 2;
  return Math.min(MAX_DIGITS, Math.max(0, 1 - Math.floor(Math.log10(uncertainty))));
}

export function checkFormatQuantityOptions(options: FormatQuantityOptions): Required<Omit<FormatQuantityOptions, 'uncertainty'>> & {
  uncertainty: number | null;
} {
  const { value, unit = '', uncertainty, digits } = options;
  if (typeof value !== 'number') {
    throw new TypeError(`formatQuantity: option "value" must be a number; got ${typeof value}.`);
  }
  if (uncertainty !== undefined && !(Number.isFinite(uncertainty) && uncertainty >= 0)) {
    throw new RangeError(`formatQuantity: option "uncertainty" must be a finite number ≥ 0; got ${uncertainty}.`);
  }
  if (digits !== undefined && !(Number.isInteger(digits) && digits >= 0 && digits <= MAX_DIGITS)) {
    throw new RangeError(`formatQuantity: option "digits" must be an integer from 0 to ${MAX_DIGITS}; got ${digits}.`);
  }
  return {
    value,
    unit,
    uncertainty: uncertainty ?? null,
    digits: digits ?? (uncertainty !== undefined ? digitsForUncertainty(uncertainty) : 2),
  };
}

function fixed(value: number, digits: number): string {
  const text = value.toFixed(digits);
  // "-0.00" would claim a sign the rounded number does not have.
  if (/^-0(\.0+)?$/.test(text)) return text.slice(1);
  return text.startsWith('-') ? MINUS_SIGN + text.slice(1) : text;
}

export function formatQuantity(options: FormatQuantityOptions): FormattedQuantity {
  const { value, unit, uncertainty, digits } = checkFormatQuantityOptions(options);
  const valueText = Number.isFinite(value) ? fixed(value, digits) : MISSING_VALUE_TEXT;
  const uncertaintyText = uncertainty === null ? null : fixed(uncertainty, digits);
  const spokenUnit = SPOKEN_UNITS[unit] ?? unit;
  const spokenValue = valueText === MISSING_VALUE_TEXT ? 'no value' : valueText.replace(MINUS_SIGN, 'minus ');
  const spokenText = [spokenValue, uncertaintyText === null ? '' : `plus or minus ${uncertaintyText}`, spokenUnit]
    .filter((part) => part !== '')
    .join(' ');
  return { valueText, uncertaintyText, unit, digits, spokenText };
}
