import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { createSeededRandom } from './seeded-random';

// jStat, a general-purpose statistics library on npm, supplies the normal reference probabilities.
const { jStat } = createRequire(import.meta.url)('jstat') as { jStat: { normal: { cdf(x: number, mean: number, sd: number): number } } };

describe('createSeededRandom', () => {
  it('repeats a stream for the same keys and gives a different one for different keys', () => {
    const a = createSeededRandom(5, 1, 2), b = createSeededRandom(5, 1, 2), c = createSeededRandom(5, 2, 1);
    const draw = (r: ReturnType<typeof createSeededRandom>) => Array.from({ length: 8 }, () => r.uniform());
    const first = draw(a);
    expect(draw(b)).toEqual(first);
    expect(draw(c)).not.toEqual(first);
  });

  it('draws normal deviates with unit variance and the standard normal tail shares of jStat to 3 standard errors', () => {
    const random = createSeededRandom(2024);
    const n = 1_000_000;
    let sum = 0, sum2 = 0;
    const beyond = [1, 2, 3].map(() => 0);
    for (let k = 0; k < n; k++) {
      const x = random.normal();
      sum += x;
      sum2 += x * x;
      for (let t = 0; t < 3; t++) if (Math.abs(x) > t + 1) beyond[t]++;
    }
    expect(Math.abs(sum / n)).toBeLessThan(3 / Math.sqrt(n));
    expect(Math.abs(sum2 / n - 1)).toBeLessThan(3 * Math.sqrt(2 / n));
    for (let t = 0; t < 3; t++) {
      const p = 2 * (1 - jStat.normal.cdf(t + 1, 0, 1));
      expect(Math.abs(beyond[t] / n - p)).toBeLessThan(3 * Math.sqrt((p * (1 - p)) / n));
    }
  });

  it('draws Poisson counts whose mean and variance both equal the rate (Poisson distribution, from memory)', () => {
    for (const rate of [0.7, 12, 400]) {
      const random = createSeededRandom(rate * 10);
      const n = 100_000;
      let sum = 0, sum2 = 0;
      for (let k = 0; k < n; k++) {
        const x = random.poisson(rate);
        sum += x;
        sum2 += x * x;
      }
      const mean = sum / n;
      expect(Math.abs(mean - rate)).toBeLessThan(4 * Math.sqrt(rate / n));
      expect(Math.abs((sum2 / n - mean * mean) / rate - 1)).toBeLessThan(0.03);
    }
  });
});
