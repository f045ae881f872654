import { describe, expect, it } from 'vitest';
import { propagateGum } from '@shared/measure/uncertainty/propagate-gum';
import { compareGumWithMonteCarlo, propagateMonteCarlo } from '@shared/measure/uncertainty/propagate-monte-carlo';
import { numericalToleranceFor } from '@shared/measure/uncertainty/compare-gum-with-monte-carlo';
import { createSeededRandom } from '@shared/measure/uncertainty/seeded-random';
import { studentTQuantile } from '@shared/measure/uncertainty/student-t';

const quotient = (v: number[]) => (v[0] * v[1]) / v[2];
const quotientInputs = [
  { name: 'image size', value: 2.5, standardUncertainty: 0.004, unit: 'mm' },
  { name: 'collimator focal length', value: 400, standardUncertainty: 0.4, unit: 'mm' },
  { name: 'target size', value: 10, standardUncertainty: 0.002, unit: 'mm' },
];

describe('propagateGum', () => {
  it('finds sensitivities equal to the analytic partial derivatives of a product/quotient model to 1e-9', () => {
    const result = propagateGum({ inputs: quotientInputs, model: quotient, outputUnit: 'mm' });
    const [a, b, c] = quotientInputs.map((i) => i.value);
    const analytic = [b / c, a / c, (-a * b) / (c * c)];
    result.budget.forEach((row, i) => expect(Math.abs(row.sensitivity - analytic[i]) / Math.abs(analytic[i])).toBeLessThan(1e-9));
    expect(result.value).toBe(100);
    // relative uncertainties add in quadrature for a pure product/quotient (JCGM 100:2008 5.1.6)
    const relative = Math.hypot(0.004 / 2.5, 0.4 / 400, 0.002 / 10);
    expect(result.combinedStandardUncertainty / 100).toBeCloseTo(relative, 10);
    expect(result.budget.reduce((s, r) => s + r.varianceShare, 0)).toBeCloseTo(1, 12);
    expect(result.budget[0].contributionMm).toBeCloseTo(0.004 * 40, 9);
    expect(result.effectiveDegreesOfFreedom).toBe(Infinity);
    expect(result.coverageFactor).toBeCloseTo(1.959964, 6);
  });

  it('computes ν_eff by Welch–Satterthwaite as in a hand-worked example and truncates it for k', () => {
    // Hand-worked: y = x₁ + x₂, u₁ = 0.3 with ν₁ = 4, u₂ = 0.4 with ν₂ = ∞ → u_c = 0.5,
    // ν_eff = 0.5⁴ / (0.3⁴/4) = 30.864…; k = t_{0.975, 30} (truncated, JCGM 100:2008 G.4.1).
    const result = propagateGum({
      inputs: [
        { name: 'repeatability', value: 10, standardUncertainty: 0.3, unit: 'mm', degreesOfFreedom: 4 },
        { name: 'scale', value: 5, standardUncertainty: 0.4, unit: 'mm' },
      ],
      model: (v) => v[0] + v[1],
    });
    expect(result.combinedStandardUncertainty).toBeCloseTo(0.5, 12);
    expect(result.effectiveDegreesOfFreedom).toBeCloseTo(0.0625 / (0.0081 / 4), 9);
    expect(result.coverageFactor).toBeCloseTo(studentTQuantile(0.975, 30), 12);
    expect(result.coverageFactor).toBeCloseTo(2.042, 3); // JCGM 100:2008 Table G.2, ν = 30, 95 %: 2.04
    expect(result.expandedUncertainty).toBeCloseTo(0.5 * result.coverageFactor, 12);
  });

  it('uses the untruncated ν_eff when asked', () => {
    const result = propagateGum({
      inputs: [
        { name: 'a', value: 1, standardUncertainty: 0.3, unit: 'mm', degreesOfFreedom: 4 },
        { name: 'b', value: 1, standardUncertainty: 0.4, unit: 'mm' },
      ],
      model: (v) => v[0] + v[1],
      degreesOfFreedomRounding: 'none',
    });
    expect(result.coverageFactor).toBeCloseTo(studentTQuantile(0.975, 0.0625 / (0.0081 / 4)), 10);
  });

  it('adds correlation terms: r = +1 adds standard uncertainties, r = −1 subtracts them', () => {
    const inputs = [
      { name: 'a', value: 3, standardUncertainty: 0.2, unit: 'mm' },
      { name: 'b', value: 4, standardUncertainty: 0.05, unit: 'mm' },
    ];
    const sum = (v: number[]) => v[0] + v[1];
    expect(propagateGum({ inputs, model: sum, correlation: [[1, 1], [1, 1]] }).combinedStandardUncertainty).toBeCloseTo(0.25, 12);
    expect(propagateGum({ inputs, model: sum, correlation: [[1, -1], [-1, 1]] }).combinedStandardUncertainty).toBeCloseTo(0.15, 12);
    expect(propagateGum({ inputs, model: sum }).combinedStandardUncertainty).toBeCloseTo(Math.hypot(0.2, 0.05), 12);
  });

  it('reports a sensitivity for an input with zero uncertainty and gives it no share', () => {
    const result = propagateGum({
      inputs: [
        { name: 'a', value: 2, standardUncertainty: 0, unit: 'mm' },
        { name: 'b', value: 3, standardUncertainty: 0.1, unit: 'mm' },
      ],
      model: (v) => v[0] * v[1],
    });
    expect(result.budget[0].sensitivity).toBeCloseTo(3, 8);
    expect(result.budget[0].varianceShare).toBe(0);
    expect(result.combinedStandardUncertainty).toBeCloseTo(0.2, 10);
  });

  it('names the bad option', () => {
    expect(() => propagateGum({ inputs: [], model: () => 1 })).toThrow('Option inputs must be a non-empty array of input quantities.');
    expect(() =>
      propagateGum({ inputs: [{ name: 'pitch', value: 3.45, standardUncertainty: -1, unit: 'µm' }], model: (v) => v[0] }),
    ).toThrow('Input "pitch" needs a standard uncertainty that is zero or positive and finite.');
    expect(() =>
      propagateGum({ inputs: quotientInputs, model: quotient, correlation: [[1, 0], [0, 1]] }),
    ).toThrow('Option correlation must be a 3 × 3 matrix, one row and column per input.');
  });
});

describe('propagateMonteCarlo', () => {
  it('agrees with GUM on a near-linear model within the JCGM 101 §8 tolerance (1e5 draws)', () => {
    const options = { inputs: quotientInputs, model: quotient };
    const gum = propagateGum(options);
    const monteCarlo = propagateMonteCarlo({ ...options, draws: 100_000, seed: 20240611 });
    const comparison = compareGumWithMonteCarlo({ gum, monteCarlo });
    console.info(`near-linear model: u_GUM ${gum.combinedStandardUncertainty.toFixed(5)}, u_MC ${monteCarlo.standardUncertainty.toFixed(5)}, dLow ${comparison.dLow.toExponential(2)}, dHigh ${comparison.dHigh.toExponential(2)}, δ ${comparison.numericalTolerance}`);
    expect(comparison.agrees).toBe(true);
    expect(monteCarlo.standardUncertainty / gum.combinedStandardUncertainty).toBeGreaterThan(0.98);
    expect(monteCarlo.standardUncertainty / gum.combinedStandardUncertainty).toBeLessThan(1.02);
    expect(Math.abs(monteCarlo.value - gum.value)).toBeLessThan(0.01 * gum.combinedStandardUncertainty + 4 * gum.combinedStandardUncertainty / Math.sqrt(1e5));
  });

  it('flags a strongly nonlinear model where the first-order GUM interval is wrong', () => {
    // y = x² with x = 0.1 ± 1: GUM linearises to u = 0.2 around 0.01; the true spread is a scaled χ²₁.
    const options = { inputs: [{ name: 'x', value: 0.1, standardUncertainty: 1, unit: 'mm' }], model: (v: number[]) => v[0] * v[0] };
    const gum = propagateGum(options);
    const monteCarlo = propagateMonteCarlo({ ...options, draws: 20_000, seed: 7 });
    const comparison = compareGumWithMonteCarlo({ gum, monteCarlo });
    expect(comparison.agrees).toBe(false);
    expect(comparison.dHigh).toBeGreaterThan(1);
    expect(monteCarlo.intervalLow).toBeGreaterThanOrEqual(0);
  });

  it('draws inputs with finite ν from a scaled-shifted t: interval ends are the t quantiles and the spread is u·√(ν/(ν−2)) (JCGM 101:2008 6.4.9)', () => {
    const monteCarlo = propagateMonteCarlo({
      inputs: [{ name: 'x', value: 0, standardUncertainty: 1, unit: 'mm', degreesOfFreedom: 5 }],
      model: (v) => v[0],
      draws: 100_000,
      seed: 99,
    });
    const t975 = studentTQuantile(0.975, 5); // 2.5706
    expect(Math.abs(monteCarlo.intervalHigh - t975)).toBeLessThan(0.05);
    expect(Math.abs(monteCarlo.intervalLow + t975)).toBeLessThan(0.05);
    expect(monteCarlo.standardUncertainty).toBeCloseTo(Math.sqrt(5 / 3), 1);
  });

  it('correlates Gaussian inputs as asked', () => {
    const inputs = [
      { name: 'a', value: 3, standardUncertainty: 0.2, unit: 'mm' },
      { name: 'b', value: 4, standardUncertainty: 0.1, unit: 'mm' },
    ];
    const correlation = [[1, 0.5], [0.5, 1]];
    const gum = propagateGum({ inputs, model: (v) => v[0] - v[1], correlation });
    const monteCarlo = propagateMonteCarlo({ inputs, model: (v) => v[0] - v[1], correlation, draws: 50_000, seed: 3 });
    expect(gum.combinedStandardUncertainty).toBeCloseTo(Math.sqrt(0.04 + 0.01 - 2 * 0.5 * 0.02), 12);
    expect(Math.abs(monteCarlo.standardUncertainty / gum.combinedStandardUncertainty - 1)).toBeLessThan(0.02);
  });

  it('is reproducible for a seed and changes with the seed', () => {
    const options = { inputs: quotientInputs, model: quotient, draws: 2_000 };
    const first = propagateMonteCarlo({ ...options, seed: 11 });
    expect(propagateMonteCarlo({ ...options, seed: 11 })).toEqual(first);
    expect(propagateMonteCarlo({ ...options, seed: 12 }).value).not.toBe(first.value);
  });

  it('names a bad draws option', () => {
    expect(() => propagateMonteCarlo({ inputs: quotientInputs, model: quotient, draws: 10 })).toThrow(
      'Option draws must be an integer of at least 100 (got 10).',
    );
  });
});

describe('numericalToleranceFor', () => {
  it('is half a unit in the last of n_dig significant digits of u (JCGM 101:2008 7.9.2, hand-worked)', () => {
    expect(numericalToleranceFor(0.0268, 2)).toBeCloseTo(0.0005, 15); // 27 × 10⁻³
    expect(numericalToleranceFor(3.7, 1)).toBeCloseTo(0.5, 15); // 4 × 10⁰
    expect(numericalToleranceFor(0.0996, 2)).toBeCloseTo(0.005, 15); // rounds to 10 × 10⁻²
    expect(numericalToleranceFor(123, 2)).toBeCloseTo(5, 12); // 12 × 10¹
  });
});

describe('createSeededRandom', () => {
  it('gives uniforms with mean ½ and variance 1/12, and normals with mean 0 and variance 1', () => {
    const random = createSeededRandom(42);
    const n = 200_000;
    let su = 0, su2 = 0, sn = 0, sn2 = 0;
    let outsideUnitInterval = 0;
    for (let i = 0; i < n; i++) {
      const u = random.nextUniform();
      const z = random.nextNormal();
      if (!(u >= 0 && u < 1)) outsideUnitInterval++;
      su += u; su2 += u * u; sn += z; sn2 += z * z;
    }
    expect(outsideUnitInterval).toBe(0);
    expect(Math.abs(su / n - 0.5)).toBeLessThan(4 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(su2 / n - (su / n) ** 2 - 1 / 12)).toBeLessThan(0.002);
    expect(Math.abs(sn / n)).toBeLessThan(4 / Math.sqrt(n));
    expect(Math.abs(sn2 / n - 1)).toBeLessThan(0.015);
  });

  it('draws gamma deviates with mean and variance equal to the shape, also below shape 1', () => {
    const random = createSeededRandom(5);
    for (const shape of [0.4, 2.5]) {
      const n = 100_000;
      let s = 0, s2 = 0;
      for (let i = 0; i < n; i++) {
        const g = random.nextGamma(shape);
        s += g; s2 += g * g;
      }
      const mean = s / n;
      expect(Math.abs(mean - shape)).toBeLessThan(5 * Math.sqrt(shape / n));
      expect(Math.abs(s2 / n - mean * mean - shape) / shape).toBeLessThan(0.05);
    }
  });
});
