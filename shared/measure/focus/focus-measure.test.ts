import { describe, expect, it } from 'vitest';
import { focusMeasures } from './focus-measure';
import { saturatedFraction } from '../image/saturated-fraction';
import type { GreyImage } from '../types';

function lehmer(seed: number) {
  let state = seed;
  return () => (state = (state * 48271) % 2147483647) / 2147483647;
}

describe('focusMeasures in one pass', () => {
  const random = lehmer(9);
  const width = 61;
  const height = 47;
  const image: GreyImage = {
    width,
    height,
    data: Float32Array.from({ length: width * height }, () => Math.round(255 * random())),
    maxValue: 255,
  };

  it('reports the clipped share saturatedFraction reports for the same level, and null without a level', () => {
    for (const level of [10, 128.5, 250, 255, 256]) {
      const set = focusMeasures(image, { saturationLevel: level });
      expect(set.saturatedFraction).toBe(saturatedFraction(image, { threshold: level }));
    }
    expect(focusMeasures(image, {}).saturatedFraction).toBeNull();
  });

  it('gives the same measures with and without counting clipped pixels, over the whole image and a rectangle', () => {
    for (const rect of [undefined, { x: 3, y: 4, width: 20, height: 9 }]) {
      expect(focusMeasures(image, { rect, saturationLevel: 200 }).measures).toEqual(focusMeasures(image, { rect }).measures);
    }
  });

  it('equals a direct evaluation of each stencil, pixel by pixel (the definitions in its doc comment)', () => {
    let sumG = 0;
    let sumL = 0;
    let sumL2 = 0;
    let sumB = 0;
    let sum = 0;
    let sum2 = 0;
    const at = (x: number, y: number) => image.data[y * width + x];
    for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) {
      sum += at(x, y);
      sum2 += at(x, y) ** 2;
    }
    for (let y = 1; y < height - 1; y++) {
      for (let x = 1; x < width - 1; x++) {
        const gx = at(x + 1, y - 1) - at(x - 1, y - 1) + 2 * (at(x + 1, y) - at(x - 1, y)) + at(x + 1, y + 1) - at(x - 1, y + 1);
        const gy = at(x - 1, y + 1) - at(x - 1, y - 1) + 2 * (at(x, y + 1) - at(x, y - 1)) + at(x + 1, y + 1) - at(x + 1, y - 1);
        const laplacian = at(x, y - 1) + at(x, y + 1) + at(x - 1, y) + at(x + 1, y) - 4 * at(x, y);
        sumG += gx * gx + gy * gy;
        sumL += laplacian;
        sumL2 += laplacian * laplacian;
        sumB += (at(x + 1, y) - at(x - 1, y)) ** 2 + (at(x, y + 1) - at(x, y - 1)) ** 2;
      }
    }
    const n = width * height;
    const interior = (width - 2) * (height - 2);
    const mean = sum / n;
    const set = focusMeasures(image, { normalise: false });
    expect(set.regionMeanIntensity).toBeCloseTo(mean, 10);
    expect(set.measures['gradient-energy']).toBeCloseTo(sumG / interior, 6);
    expect(set.measures['laplacian-variance']).toBeCloseTo(sumL2 / interior - (sumL / interior) ** 2, 6);
    expect(set.measures.brenner).toBeCloseTo(sumB / interior, 6);
    expect(set.measures['normalised-variance']).toBeCloseTo((sum2 / n - mean * mean) / mean, 6);
  });

  it('names a saturation level that is not a number', () => {
    expect(() => focusMeasures(image, { saturationLevel: Number.NaN })).toThrow('saturationLevel must be a finite number (got NaN).');
  });
});
