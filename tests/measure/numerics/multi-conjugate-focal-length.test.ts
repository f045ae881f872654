import { describe, expect, it } from 'vitest';
import { solveMultiConjugate, type Conjugate } from '@shared/measure/solvers/solve-multi-conjugate';
import { multiConjugateFocalLength, multiConjugateScratch, type ConjugateColumns } from '@shared/measure/solvers/multi-conjugate-focal-length';
import { createSeededRandom } from '@shared/measure/uncertainty/seeded-random';

function columnsOf(conjugates: Conjugate[]): ConjugateColumns {
  const column = (pick: (c: Conjugate) => number) => Float64Array.from(conjugates, pick);
  return {
    objectDistanceMm: column((c) => c.objectDistanceFromMarkMm),
    imageDistanceMm: column((c) => c.imageDistanceFromMarkMm),
    magnitude: column((c) => Math.abs(c.magnification)),
    objectDistanceUncertaintyMm: column((c) => c.objectDistanceUncertaintyMm),
    imageDistanceUncertaintyMm: column((c) => c.imageDistanceUncertaintyMm),
    magnificationUncertainty: column((c) => c.magnificationUncertainty),
  };
}

describe('multiConjugateFocalLength (the Monte Carlo path)', () => {
  it('gives the focal length of solveMultiConjugate to 1e-10 relative on noisy thick-lens conjugates', () => {
    const random = createSeededRandom(11);
    let cases = 0;
    for (const f of [25, 50, 101.3, 300]) {
      for (const conjugateCount of [2, 3, 5, 8]) {
        for (let trial = 0; trial < 10; trial++) {
          // Thick lens: H at mark + h, H′ at mark + h′; object distance s from H, image distance s′ from H′ (Newton: 1/s + 1/s′ = 1/f).
          const h = (random.nextUniform() - 0.5) * 0.3 * f;
          const hPrime = (random.nextUniform() - 0.5) * 0.3 * f;
          const conjugates: Conjugate[] = Array.from({ length: conjugateCount }, (_, i) => {
            const s = f * (1.3 + 3 * (i + random.nextUniform()) / conjugateCount);
            const sPrime = (s * f) / (s - f);
            const m = sPrime / s;
            return {
              objectDistanceFromMarkMm: s - h + 0.05 * random.nextNormal(),
              imageDistanceFromMarkMm: sPrime + hPrime + 0.04 * random.nextNormal(),
              magnification: -m * (1 + 0.001 * random.nextNormal()),
              objectDistanceUncertaintyMm: 0.05,
              imageDistanceUncertaintyMm: 0.04 + 0.01 * i,
              magnificationUncertainty: 0.001 * m,
            };
          });
          const reference = solveMultiConjugate({ conjugates }).focalLengthMm;
          const fast = multiConjugateFocalLength(columnsOf(conjugates), multiConjugateScratch(conjugateCount));
          expect(Math.abs(fast - reference), `f=${f}, ${conjugateCount} conjugates: ${fast} vs ${reference}`).toBeLessThanOrEqual(1e-10 * reference);
          cases++;
        }
      }
    }
    expect(cases).toBe(160);
  });
});
