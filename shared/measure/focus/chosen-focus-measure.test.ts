import { describe, expect, it } from 'vitest';
import { FOCUS_OPERATORS, focusMeasures } from './focus-measure';
import { chosenFocusMeasure } from './chosen-focus-measure';
import type { GreyImage } from '../types';

function lehmer(seed: number) {
  let state = seed;
  return () => (state = (state * 48271) % 2147483647) / 2147483647;
}

describe('chosenFocusMeasure', () => {
  const random = lehmer(21);
  const width = 73;
  const height = 58;
  // 16-bit levels with some pixels at full scale, so the clipped share is not zero.
  const image: GreyImage = {
    width,
    height,
    data: Float32Array.from({ length: width * height }, () => Math.min(65535, Math.round(70000 * random()))),
    maxValue: 65535,
  };

  it('gives exactly what focusMeasures gives for each operator, with the same mean level and clipped share', () => {
    const rects = [undefined, { x: 5, y: 7, width: 40, height: 31 }, { x: 0, y: 0, width: 3, height: 3 }];
    for (const rect of rects) {
      for (const normalise of [true, false]) {
        const all = focusMeasures(image, { rect, normalise, saturationLevel: 65000 });
        for (const operator of FOCUS_OPERATORS) {
          const chosen = chosenFocusMeasure(image, { operator, rect, normalise, saturationLevel: 65000 });
          expect(chosen.value).toBe(all.measures[operator]);
          expect(chosen.regionMeanIntensity).toBe(all.regionMeanIntensity);
          expect(chosen.saturatedFraction).toBe(all.saturatedFraction);
        }
      }
    }
    expect(chosenFocusMeasure(image, { operator: 'gradient-energy' }).saturatedFraction).toBeNull();
  });

  it('names a bad operator and a black region', () => {
    expect(() => chosenFocusMeasure(image, { operator: 'sharpness' as never })).toThrow(/operator must be one of gradient-energy/);
    const black: GreyImage = { width: 8, height: 8, data: new Float32Array(64), maxValue: 255 };
    expect(() => chosenFocusMeasure(black, { operator: 'gradient-energy' })).toThrow(/positive mean intensity/);
  });
});
