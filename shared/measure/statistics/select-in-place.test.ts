import { describe, expect, it } from 'vitest';
import { quantileInPlace, selectInPlace } from './select-in-place';
import { quantileOfSorted } from '../target/robust-statistics';

/** Deterministic test data (a Lehmer generator, common practice for fixtures). */
function lehmer(seed: number) {
  let state = seed;
  return () => (state = (state * 48271) % 2147483647) / 2147483647;
}

const random = lehmer(12345);
const shapes: Record<string, (n: number) => Float64Array> = {
  uniform: (n) => Float64Array.from({ length: n }, () => random()),
  'few distinct values': (n) => Float64Array.from({ length: n }, () => Math.floor(random() * 5)),
  'V-shaped (absolute deviations)': (n) => Float64Array.from({ length: n }, (_, i) => Math.abs(i - n / 2) + random() * 1e-3),
  sorted: (n) => Float64Array.from({ length: n }, (_, i) => i * 0.5),
  'reversed with a spike': (n) => Float64Array.from({ length: n }, (_, i) => (i === 7 ? 1e9 : n - i)),
  constant: (n) => new Float64Array(n).fill(3.25),
};

describe('quantileInPlace', () => {
  for (const [name, make] of Object.entries(shapes)) {
    it(`gives exactly the linearly interpolated order statistic of the sorted values (${name})`, () => {
      // Reference: sort, then interpolate between order statistics (R type 7, common practice).
      for (const n of [1, 2, 3, 17, 1_999, 2_000, 2_001, 10_000]) {
        const values = make(n);
        const sorted = Float64Array.from(values).sort();
        for (const p of [0, 0.001, 0.25, 0.5, 0.75, 0.999, 1]) {
          expect(quantileInPlace(Float64Array.from(values), p)).toBe(quantileOfSorted(sorted, p));
        }
      }
    });
  }

  it('reads only the first `count` values', () => {
    const values = Float64Array.from([5, 1, 4, 2, 3, 100, -100]);
    expect(quantileInPlace(values, 0.5, 5)).toBe(3);
  });

  it('is NaN for no values', () => {
    expect(quantileInPlace(new Float64Array(0), 0.5)).toBeNaN();
  });
});

describe('selectInPlace', () => {
  it('puts the k-th smallest at k with nothing larger before it and nothing smaller after it', () => {
    const values = shapes.uniform(5_000);
    const sorted = Float64Array.from(values).sort();
    for (const k of [0, 1, 2_499, 4_998, 4_999]) {
      const work = Float64Array.from(values);
      expect(selectInPlace(work, k)).toBe(sorted[k]);
      for (let i = 0; i < k; i++) expect(work[i]).toBeLessThanOrEqual(work[k]);
      for (let i = k + 1; i < work.length; i++) expect(work[i]).toBeGreaterThanOrEqual(work[k]);
    }
  });
});
