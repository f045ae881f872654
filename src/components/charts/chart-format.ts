const MINUS_SIGN = '\u2212';

/** Fixed decimals with a true minus sign (and no "−0.00"). */
export function formatFixed(value: number, decimals: number): string {
  if (!Number.isFinite(value)) return '—';
  const text = value.toFixed(decimals);
  if (/^-0(\.0+)?$/.test(text)) return text.slice(1);
  return text.startsWith('-') ? MINUS_SIGN + text.slice(1) : text;
}

/** Significant digits with a true minus sign; exponent form only outside 1e−4 … 1e6. */
export function formatSignificant(value: number, significantDigits: number): string {
  if (!Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  let text: string;
  if (magnitude < 1e-4 || magnitude >= 1e6) {
    const [mantissa, exponent] = value.toExponential(significantDigits - 1).split('e');
    const power = Number(exponent);
    text = `${mantissa}×10${superscript(power)}`;
  } else {
    const decimals = Math.max(0, significantDigits - 1 - Math.floor(Math.log10(magnitude)));
    text = value.toFixed(decimals);
  }
  return text.replace(/^-/, MINUS_SIGN);
}

const SUPERSCRIPT_DIGITS = '⁰¹²³⁴⁵⁶⁷⁸⁹';

function superscript(power: number): string {
  const digits = String(Math.abs(power))
    .split('')
    .map((d) => SUPERSCRIPT_DIGITS[Number(d)])
    .join('');
  return (power < 0 ? '⁻' : '') + digits;
}
