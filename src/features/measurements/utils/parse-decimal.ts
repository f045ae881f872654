/**
 * Reads a number typed by a person: "12.5", " -3 ", "12,5" (a decimal comma,
 * common on European benches). Empty text is `undefined` (not given); text
 * that is not a finite number is `null` (a mistake to name).
 */
export function parseDecimal(text: string): number | null | undefined {
  const trimmed = text.trim().replace(/\u2212/g, '-');
  if (trimmed === '') return undefined;
  // One decimal comma and no point: read it as a decimal separator, never as a thousands separator.
  const normalised = /^[+-]?\d*,\d+$/.test(trimmed) ? trimmed.replace(',', '.') : trimmed;
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(normalised)) return null;
  const value = Number(normalised);
  return Number.isFinite(value) ? value : null;
}
