const DECIMAL = /^[+\-\u2212]?(\d+([.,]\d*)?|[.,]\d+)$/;

/**
 * A decimal number as typed at a bench: point or comma for the decimals, an
 * optional sign (the typographic minus too), no thousands separators, no
 * exponents. Null when the text is not such a number.
 */
export function parseDecimal(text: string): number | null {
  const trimmed = text.trim().replace(/\s+/g, '');
  if (!DECIMAL.test(trimmed)) return null;
  const value = Number(trimmed.replace('\u2212', '-').replace(',', '.'));
  return Number.isFinite(value) ? value : null;
}
