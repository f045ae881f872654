import { describe, expect, it } from 'vitest';
import { checkFormatQuantityOptions, digitsForUncertainty, formatQuantity } from '@/lib/format-quantity';

describe('formatQuantity', () => {
  it('formatQuantity prints value and uncertainty with the same number of decimals', () => {
    const q = formatQuantity({ value: 99.934, uncertainty: 0.1249, unit: 'mm', digits: 2 });
    expect(q.valueText).toBe('99.93');
    expect(q.uncertaintyText).toBe('0.12');
    expect(q.unit).toBe('mm');
  });

  it('formatQuantity shows the uncertainty to two significant digits by default (GUM, JCGM 100:2008, 7.2.6)', () => {
    expect(formatQuantity({ value: 99.93456, uncertainty: 0.123 }).valueText).toBe('99.93');
    expect(formatQuantity({ value: 99.93456, uncertainty: 0.0123 }).valueText).toBe('99.935');
    expect(formatQuantity({ value: 1234.4, uncertainty: 25 }).valueText).toBe('1234');
    expect(digitsForUncertainty(1.5)).toBe(1);
    expect(digitsForUncertainty(0)).toBe(2);
  });

  it('formatQuantity writes negatives with a true minus sign (U+2212) and never shows "-0"', () => {
    expect(formatQuantity({ value: -2.5, digits: 1 }).valueText).toBe('\u22122.5');
    expect(formatQuantity({ value: -0.001, digits: 2 }).valueText).toBe('0.00');
  });

  it('formatQuantity prints an em dash for a missing (non-finite) value', () => {
    expect(formatQuantity({ value: Number.NaN, unit: 'mm' }).valueText).toBe('—');
    expect(formatQuantity({ value: Number.NaN, unit: 'mm' }).spokenText).toBe('no value millimetres');
  });

  it('formatQuantity gives screen readers the unit in words', () => {
    expect(formatQuantity({ value: -99.93, uncertainty: 0.12, unit: 'mm' }).spokenText).toBe(
      'minus 99.93 plus or minus 0.12 millimetres',
    );
    expect(formatQuantity({ value: 12, unit: 'ms', digits: 0 }).spokenText).toBe('12 milliseconds');
  });

  it('checkFormatQuantityOptions names the bad option in its message', () => {
    expect(() => checkFormatQuantityOptions({ value: 1, digits: 2.5 })).toThrow(
      'formatQuantity: option "digits" must be an integer from 0 to 12; got 2.5.',
    );
    expect(() => checkFormatQuantityOptions({ value: 1, uncertainty: -0.1 })).toThrow(
      'formatQuantity: option "uncertainty" must be a finite number ≥ 0; got -0.1.',
    );
    expect(() => checkFormatQuantityOptions({ value: '3' as unknown as number })).toThrow(
      'formatQuantity: option "value" must be a number; got string.',
    );
  });
});
