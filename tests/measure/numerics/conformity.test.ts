// Decision rules: ILAC-G8:09/2019 §4.2 (simple acceptance) and §4.2.2 / JCGM 106:2012 §8.3 (guard band w = U).
import { describe, expect, it } from 'vitest';
import { decideConformity } from '@shared/measure/conformity/decide-conformity';
import { toleranceLimits } from '@shared/measure/conformity/tolerance-limits';

const limits = { lowerLimit: 98, upperLimit: 102 };

describe('decideConformity with simple acceptance', () => {
  it('conforms inside the limits and exactly on them, and does not conform just outside, whatever U', () => {
    const decide = (measuredValue: number) => decideConformity({ ...limits, measuredValue, expandedUncertainty: 1.5, rule: 'simple' }).decision;
    expect(decide(100)).toBe('conforms');
    expect(decide(98)).toBe('conforms');
    expect(decide(102)).toBe('conforms');
    expect(decide(97.999999)).toBe('does-not-conform');
    expect(decide(102.000001)).toBe('does-not-conform');
  });

  it('names the rule in its statement and reports the limits as acceptance and rejection zones', () => {
    const result = decideConformity({ ...limits, measuredValue: 101.2, expandedUncertainty: 1.5, rule: 'simple' });
    expect(result.statement).toMatch(/^Under simple acceptance/);
    expect(result.statement).toContain('101.2 mm (U = 1.5 mm)');
    expect([result.acceptanceLower, result.acceptanceUpper, result.rejectionLower, result.rejectionUpper]).toEqual([98, 102, 98, 102]);
  });
});

describe('decideConformity with guarded acceptance (w = U)', () => {
  const U = 0.5;
  const decide = (measuredValue: number) => decideConformity({ ...limits, measuredValue, expandedUncertainty: U, rule: 'guarded' });

  it('places the acceptance zone at [L + U, H − U] and the rejection zone outside [L − U, H + U]', () => {
    const result = decide(100);
    expect([result.acceptanceLower, result.acceptanceUpper, result.rejectionLower, result.rejectionUpper]).toEqual([98.5, 101.5, 97.5, 102.5]);
  });

  it('conforms at and just inside the acceptance limits, is undecided just beyond them', () => {
    expect(decide(98.5).decision).toBe('conforms');
    expect(decide(101.5).decision).toBe('conforms');
    expect(decide(101.500001).decision).toBe('undecided');
    expect(decide(98.499999).decision).toBe('undecided');
  });

  it('is undecided on the tolerance limits and up to the rejection limits, and does not conform beyond them', () => {
    expect(decide(102).decision).toBe('undecided');
    expect(decide(102.5).decision).toBe('undecided');
    expect(decide(102.500001).decision).toBe('does-not-conform');
    expect(decide(97.5).decision).toBe('undecided');
    expect(decide(97.499999).decision).toBe('does-not-conform');
  });

  it('writes a one-sentence statement naming the rule for each outcome', () => {
    for (const value of [100, 102, 103]) {
      const { statement } = decide(value);
      expect(statement).toMatch(/^Under guarded acceptance \(guard band equal to U\)/);
      expect(statement.trim().split(/\.\s/).length).toBe(1);
    }
    expect(decide(102).statement).toContain('cannot be decided');
  });

  it('cannot accept anything when U is wider than half the tolerance', () => {
    const result = decideConformity({ ...limits, measuredValue: 100, expandedUncertainty: 2.5, rule: 'guarded' });
    expect(result.decision).toBe('undecided');
    expect(result.acceptanceLower).toBeGreaterThan(result.acceptanceUpper);
  });

  it('names a bad option', () => {
    expect(() => decideConformity({ lowerLimit: 5, upperLimit: 4, measuredValue: 1, expandedUncertainty: 0, rule: 'simple' })).toThrow(
      'Option lowerLimit (5) must be below upperLimit (4).',
    );
  });
});

describe('toleranceLimits', () => {
  it('puts ± percent of the nominal or ± mm around it', () => {
    expect(toleranceLimits({ nominalFocalLengthMm: 100, tolerancePercent: 2 })).toEqual({ lowerLimit: 98, upperLimit: 102 });
    expect(toleranceLimits({ nominalFocalLengthMm: -50, tolerancePercent: 1 })).toEqual({ lowerLimit: -50.5, upperLimit: -49.5 });
    expect(toleranceLimits({ nominalFocalLengthMm: 75, toleranceMm: 0.4 })).toEqual({ lowerLimit: 74.6, upperLimit: 75.4 });
  });

  it('wants exactly one kind of tolerance', () => {
    expect(() => toleranceLimits({ nominalFocalLengthMm: 100 })).toThrow('Give exactly one of the options tolerancePercent and toleranceMm.');
    expect(() => toleranceLimits({ nominalFocalLengthMm: 100, tolerancePercent: 1, toleranceMm: 1 })).toThrow(
      'Give exactly one of the options tolerancePercent and toleranceMm.',
    );
  });
});
