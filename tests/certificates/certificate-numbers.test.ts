import { describe, expect, it } from 'vitest';
import {
  decimalsForUncertainty,
  formatAtDecimals,
  formatMeasuredValue,
  formatPercent,
  formatSignificant,
} from '../../server/certificates/certificate-numbers';

describe('formatMeasuredValue', () => {
  it('formatMeasuredValue gives U two significant digits and the value the same decimal place', () => {
    // JCGM 100:2008 §7.2.6: at most two significant digits for the uncertainty, the estimate rounded to match.
    expect(formatMeasuredValue({ value: 100.2345, uncertainty: 0.1534 })).toEqual({ valueText: '100.23', uncertaintyText: '0.15', decimals: 2 });
    expect(formatMeasuredValue({ value: 9.976605, uncertainty: 0.0099 })).toEqual({ valueText: '9.9766', uncertaintyText: '0.0099', decimals: 4 });
    expect(formatMeasuredValue({ value: 652.3141, uncertainty: 1.2 })).toEqual({ valueText: '652.3', uncertaintyText: '1.2', decimals: 1 });
  });

  it('formatMeasuredValue keeps two digits when rounding carries U into the next decade', () => {
    expect(formatMeasuredValue({ value: 50.01234, uncertainty: 0.0996 })).toEqual({ valueText: '50.01', uncertaintyText: '0.10', decimals: 2 });
    expect(formatMeasuredValue({ value: 1234.5, uncertainty: 99.7 })).toEqual({ valueText: '1230', uncertaintyText: '100', decimals: -1 });
  });

  it('formatMeasuredValue rounds to tens for U of 100 or more', () => {
    expect(formatMeasuredValue({ value: 1234.5, uncertainty: 153 })).toEqual({ valueText: '1230', uncertaintyText: '150', decimals: -1 });
  });

  it('formatMeasuredValue prints negative values with a typographic minus and never "-0"', () => {
    expect(formatMeasuredValue({ value: -1.8714, uncertainty: 0.091 }).valueText).toBe('\u22121.871');
    expect(formatAtDecimals(-0.0004, 3)).toBe('0.000');
  });

  it('decimalsForUncertainty names a bad uncertainty', () => {
    expect(() => decimalsForUncertainty(0)).toThrow('Option uncertainty must be a positive finite number (got 0).');
    expect(() => decimalsForUncertainty(Number.NaN)).toThrow('Option uncertainty must be a positive finite number (got NaN).');
  });
});

describe('formatSignificant and formatPercent', () => {
  it('formatSignificant shows the asked number of significant digits without an exponent for ordinary sizes', () => {
    expect(formatSignificant(0.0207, 3)).toBe('0.0207');
    expect(formatSignificant(-9.7104, 3)).toBe('\u22129.71');
    expect(formatSignificant(2914.6, 2)).toBe('2900');
    expect(formatSignificant(0, 3)).toBe('0');
    expect(formatSignificant(3.2e-6, 2)).toBe('3.2e\u22126');
  });

  it('formatPercent drops trailing zeros and keeps at most two decimals', () => {
    expect(formatPercent(0.95)).toBe('95');
    expect(formatPercent(0.9545)).toBe('95.45');
    expect(formatPercent(0.99731)).toBe('99.73');
  });
});
