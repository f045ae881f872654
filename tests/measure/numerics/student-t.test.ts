import { describe, expect, it } from 'vitest';
import { createRequire } from 'node:module';
import { coverageFactorFor, studentTCumulative, studentTQuantile } from '@shared/measure/uncertainty/student-t';
import { InvalidOptionError } from '@shared/measure/fit/invalid-option-error';

// Outside reference: jStat (general-purpose statistics library on npm), jStat.studentt.inv / .cdf.
interface JStatStudentT {
  studentt: { inv(p: number, dof: number): number; cdf(t: number, dof: number): number };
}
const jStat = (createRequire(import.meta.url)('jstat') as { jStat: JStatStudentT }).jStat;

const degreesOfFreedomToCheck = [
  1, 1.5, 2, 2.5, 3, 3.7, 4, 5, 6, 7, 8, 9, 10, 11.3, 12, 15, 20, 24.6, 30, 40, 50, 60, 75.5, 100, 120, 150, 199.9, 200,
];
const probabilitiesToCheck = [0.6, 0.75, 0.8, 0.9, 0.95, 0.975, 0.99, 0.995, 0.999, 0.9995, 0.25, 0.05, 0.025, 0.005, 0.0005];

describe('studentTQuantile', () => {
  it('agrees with jStat.studentt.inv to 1e-6 relative for ν from 1 to 200 (integer and not) and p from 0.0005 to 0.9995', () => {
    let worstRelative = 0;
    for (const nu of degreesOfFreedomToCheck) {
      for (const p of probabilitiesToCheck) {
        const ours = studentTQuantile(p, nu);
        const reference = jStat.studentt.inv(p, nu);
        const relative = Math.abs(ours - reference) / Math.abs(reference);
        worstRelative = Math.max(worstRelative, relative);
        expect(relative, `ν=${nu}, p=${p}: ours ${ours}, jStat ${reference}`).toBeLessThan(1e-6);
      }
    }
    console.info(`studentTQuantile vs jStat: worst relative difference ${worstRelative.toExponential(2)}`);
  });

  it('inverts its own cumulative distribution to 1e-10 of the tail probability (round trip)', () => {
    for (const nu of [1, 2.2, 3, 7.5, 30, 1000, 1e6]) {
      for (const p of [1e-9, 1e-4, 0.1, 0.4, 0.51, 0.9, 0.999999]) {
        const t = studentTQuantile(p, nu);
        expect(Math.abs(studentTCumulative(t, nu) - p) / Math.min(p, 1 - p)).toBeLessThan(1e-10);
      }
    }
  });

  it('gives the exact Cauchy values for ν = 1', () => {
    // ν = 1 is the Cauchy distribution, F(t) = ½ + atan(t)/π (from memory).
    expect(studentTCumulative(-1, 1)).toBeCloseTo(0.25, 15);
    expect(studentTQuantile(0.75, 1)).toBeCloseTo(1, 14);
  });

  it('is odd about p = 0.5 and zero at the median', () => {
    expect(studentTQuantile(0.5, 7)).toBe(0);
    expect(studentTQuantile(0.1, 4.5)).toBeCloseTo(-studentTQuantile(0.9, 4.5), 14);
  });

  it('tends to the normal quantile as ν grows and equals it at ν = Infinity', () => {
    // 1.959963984540054: Φ⁻¹(0.975), common practice value quoted in JCGM 100:2008 Table G.2 as 1.960.
    expect(studentTQuantile(0.975, Infinity)).toBeCloseTo(1.959963984540054, 13);
    expect(studentTQuantile(0.975, 1e8)).toBeCloseTo(1.959963984540054, 7);
    expect(studentTQuantile(0.975, 1e6)).toBeCloseTo(1.9599659, 6); // jStat-independent: Cornish–Fisher first term z + (z³+z)/(4ν), from memory
  });

  // jStat's own incomplete beta is good to a few 1e-9 (its ν = 1 value at t = −1 is 0.2499999985, exact ¼), hence 7 places.
  it('agrees with jStat.studentt.cdf to 7 decimal places', () => {
    for (const nu of [1, 3.3, 10, 120]) {
      for (const t of [-4, -1, 0.3, 2, 6]) {
        expect(studentTCumulative(t, nu)).toBeCloseTo(jStat.studentt.cdf(t, nu), 7);
      }
    }
  });

  it('names the bad option in its error', () => {
    expect(() => studentTQuantile(0.9, 0)).toThrow(new InvalidOptionError('Option degreesOfFreedom must be a positive number or Infinity (got 0).'));
    expect(() => studentTQuantile(1.2, 3)).toThrow('Option probability must lie between 0 and 1 (got 1.2).');
  });
});

describe('coverageFactorFor', () => {
  it('gives the 95 % two-sided factor t_{0.975,ν} and 1.96 for ν = Infinity', () => {
    // JCGM 100:2008 Table G.2 (95 %): ν=1 → 12.71, ν=2 → 4.30, ν=10 → 2.23, ν=∞ → 1.960.
    expect(coverageFactorFor({ degreesOfFreedom: 1 })).toBeCloseTo(12.71, 2);
    expect(coverageFactorFor({ degreesOfFreedom: 2 })).toBeCloseTo(4.3, 2);
    expect(coverageFactorFor({ degreesOfFreedom: 10 })).toBeCloseTo(2.23, 2);
    expect(coverageFactorFor({ degreesOfFreedom: Infinity })).toBeCloseTo(1.95996, 5);
    expect(coverageFactorFor({ degreesOfFreedom: 10, coverageProbability: 0.6827 })).toBeCloseTo(jStat.studentt.inv(0.84135, 10), 8);
  });

  it('rejects a coverage probability outside (0, 1) naming the option', () => {
    expect(() => coverageFactorFor({ degreesOfFreedom: 5, coverageProbability: 95 })).toThrow(
      'Option coverageProbability must lie strictly between 0 and 1 (got 95).',
    );
  });
});
