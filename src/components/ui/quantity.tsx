import { formatQuantity } from '@/lib/format-quantity';

const SIZES = {
  inline: { value: '', unit: 'text-[0.92em]', uncertainty: '' },
  lead: { value: 'text-lead', unit: 'text-body', uncertainty: 'text-body' },
  result: { value: 'text-result font-medium', unit: 'text-title', uncertainty: 'text-title' },
} as const;

export interface QuantityProps {
  value: number;
  unit?: string;
  /** Expanded uncertainty in the same unit. */
  uncertainty?: number;
  /** Decimals; by default U is shown to two significant digits. */
  digits?: number;
  size?: keyof typeof SIZES;
  className?: string;
}

/**
 * A number with its unit: tabular figures, a true minus sign, the unit in a
 * lighter weight after a space, and "± U" when an uncertainty is given.
 */
export function Quantity({ value, unit, uncertainty, digits, size = 'inline', className = '' }: QuantityProps) {
  const formatted = formatQuantity({ value, unit, uncertainty, digits });
  const sizing = SIZES[size];
  return (
    <span className={`inline-flex items-baseline gap-x-[0.3em] whitespace-nowrap ${className}`} data-quantity>
      <span className="sr-only">{formatted.spokenText}</span>
      <span aria-hidden="true" className={`numerals text-ink ${sizing.value}`}>{formatted.valueText}</span>
      {formatted.uncertaintyText !== null ? (
        <span aria-hidden="true" className={`numerals text-ink-soft ${sizing.uncertainty}`}>± {formatted.uncertaintyText}</span>
      ) : null}
      {formatted.unit ? (
        <span aria-hidden="true" className={`font-sans font-light text-ink-faint ${sizing.unit}`} data-unit>
          {formatted.unit}
        </span>
      ) : null}
    </span>
  );
}
