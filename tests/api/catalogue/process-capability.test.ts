import { describe, expect, it } from 'vitest';
import { InvalidOptionError } from '../../../shared/measure/fit/invalid-option-error';
import { processCapability } from '../../../server/services/process-capability';

// From memory: Cp = (USL − LSL)/(6σ), Cpk = min(USL − μ, μ − LSL)/(3σ), common practice in process capability,
// with σ estimated by the sample standard deviation s (n − 1). The figures below are worked by hand.
describe('processCapability', () => {
  it('matches a hand-worked off-centre batch: mean 100.5 mm, s = √0.1 mm, Cp 1.0541, Cpk 0.5270', () => {
    // Deviations from 100.5: −0.4, −0.2, 0, 0.2, 0.4 → Σd² = 0.4, s² = 0.4/4 = 0.1, s = 0.316228 mm.
    // Cp = 2/(6 × 0.316228) = 1.054093; Cpk = min(0.5, 1.5)/(3 × 0.316228) = 0.527046.
    const result = processCapability({ valuesMm: [100.1, 100.3, 100.5, 100.7, 100.9], lowerLimitMm: 99, upperLimitMm: 101 });
    expect(result.count).toBe(5);
    expect(result.meanMm).toBeCloseTo(100.5, 12);
    expect(result.standardDeviationMm).toBeCloseTo(Math.sqrt(0.1), 12);
    expect(result.cp).toBeCloseTo(1.054093, 6);
    expect(result.cpk).toBeCloseTo(0.527046, 6);
  });

  it('gives Cpk = Cp for a centred batch and a negative Cpk when the mean lies outside the band', () => {
    const centred = processCapability({ valuesMm: [99.2, 99.6, 100, 100.4, 100.8], lowerLimitMm: 99, upperLimitMm: 101 });
    // s² = (0.64 + 0.16 + 0 + 0.16 + 0.64)/4 = 0.4 → Cp = 2/(6√0.4) = 0.527046.
    expect(centred.cp).toBeCloseTo(0.527046, 6);
    expect(centred.cpk).toBeCloseTo(centred.cp!, 12);

    const outside = processCapability({ valuesMm: [101.2, 101.4], lowerLimitMm: 99, upperLimitMm: 101 });
    // mean 101.3, s = √0.02 = 0.141421 → Cpk = (101 − 101.3)/(3 × 0.141421) = −0.707107.
    expect(outside.cpk).toBeCloseTo(-0.707107, 6);
  });

  it('keeps µm-level spreads on a 100 mm mean exact to 1e-9 mm (Welford update)', () => {
    const values = [100.000001, 100.000003, 100.000002, 100.000004];
    // Mean 100.0000025; deviations ±0.0000015, ±0.0000005 → s² = (2×2.25e-12 + 2×0.25e-12)/3 = 1.6667e-12.
    const result = processCapability({ valuesMm: values, lowerLimitMm: 99, upperLimitMm: 101 });
    expect(result.meanMm).toBeCloseTo(100.0000025, 9);
    expect(result.standardDeviationMm).toBeCloseTo(Math.sqrt(5e-12 / 3), 9);
  });

  it('returns null Cp and Cpk for identical values (zero spread)', () => {
    const result = processCapability({ valuesMm: [50, 50, 50], lowerLimitMm: 49, upperLimitMm: 51 });
    expect(result).toEqual({ count: 3, meanMm: 50, standardDeviationMm: 0, cp: null, cpk: null });
  });

  it('names the bad option in a sentence', () => {
    expect(() => processCapability({ valuesMm: [1], lowerLimitMm: 0, upperLimitMm: 2 })).toThrow(
      new InvalidOptionError('Option valuesMm must hold at least two measured values.'),
    );
    expect(() => processCapability({ valuesMm: [1, Number.NaN], lowerLimitMm: 0, upperLimitMm: 2 })).toThrow(
      'Option valuesMm must hold finite numbers (item 1 is NaN).',
    );
    expect(() => processCapability({ valuesMm: [1, 2], lowerLimitMm: 2, upperLimitMm: 2 })).toThrow(
      'Option upperLimitMm (2) must be greater than lowerLimitMm (2).',
    );
  });
});
