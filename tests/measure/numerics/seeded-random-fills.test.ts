import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { createSeededRandom } from '@shared/measure/uncertainty/seeded-random';

// Outside reference: jStat (general-purpose statistics library on npm), jStat.normal.cdf and jStat.studentt.cdf.
interface JStat {
  normal: { cdf(x: number, mean: number, sd: number): number };
  studentt: { cdf(x: number, dof: number): number };
}
const jStat = (createRequire(import.meta.url)('jstat') as { jStat: JStat }).jStat;

/** Kolmogorov–Smirnov distance between a sample and a distribution function. */
function ksDistance(sample: Float64Array, cdf: (x: number) => number): number {
  const sorted = Float64Array.from(sample).sort();
  let d = 0;
  for (let i = 0; i < sorted.length; i++) {
    const f = cdf(sorted[i]);
    d = Math.max(d, (i + 1) / sorted.length - f, f - i / sorted.length);
  }
  return d;
}

// Critical value of the one-sample KS test at α = 0.001 for large n: 1.95/√n (common practice; Smirnov's asymptotic distribution).
const ksCritical = (n: number) => 1.95 / Math.sqrt(n);

describe('SeededRandom fills (Monte Carlo streams)', () => {
  it('fills standard normals by the ziggurat: the KS distance from jStat’s normal CDF is below the 0.1 % critical value, and the tails beyond the base strip appear as often as they should', () => {
    const random = createSeededRandom(20261202);
    const n = 200_000;
    const sample = new Float64Array(n);
    random.fillNormal(sample);
    expect(ksDistance(sample, (x) => jStat.normal.cdf(x, 0, 1))).toBeLessThan(ksCritical(n));
    let beyondR = 0;
    let sum = 0;
    let sumSq = 0;
    for (const z of sample) {
      if (Math.abs(z) > 3.442619855899) beyondR++;
      sum += z;
      sumSq += z * z;
    }
    // P(|Z| > 3.4426) = 2(1 − Φ(3.4426)) ≈ 5.76e-4: about 115 of 2e5 (Poisson spread ≈ 11).
    const expected = 2 * (1 - jStat.normal.cdf(3.442619855899, 0, 1)) * n;
    expect(Math.abs(beyondR - expected)).toBeLessThan(5 * Math.sqrt(expected));
    expect(Math.abs(sum / n)).toBeLessThan(4 / Math.sqrt(n));
    expect(Math.abs(sumSq / n - 1)).toBeLessThan(0.015);
  });

  it('fills Student t deviates whose KS distance from jStat’s t CDF is below the 0.1 % critical value, for small and large ν', () => {
    const random = createSeededRandom(7);
    const n = 100_000;
    for (const nu of [3, 8, 50]) {
      const sample = new Float64Array(n);
      random.fillStudentT(sample, nu);
      expect(ksDistance(sample, (x) => jStat.studentt.cdf(x, nu)), `ν = ${nu}`).toBeLessThan(ksCritical(n));
    }
  });

  it('fills normals for ν = Infinity, is reproducible for a seed, and changes with the seed', () => {
    const fill = (seed: number) => {
      const out = new Float64Array(1000);
      createSeededRandom(seed).fillStudentT(out, Infinity);
      return Array.from(out);
    };
    expect(fill(3)).toEqual(fill(3));
    expect(fill(3)).not.toEqual(fill(4));
    expect(fill(3).every(Number.isFinite)).toBe(true);
  });
});
