import { describe, expect, it } from 'vitest';
import type { GreyImage, PixelRect } from '../types';
import { boxReduce, gradientEnergySums } from './pixel-kernels';

// Plain JavaScript references, written from the definitions (3 × 3 Sobel kernels, box mean), one pixel at a time.
function referenceGradientSums(image: GreyImage, rect: PixelRect, shift: number, level: number) {
  const at = (x: number, y: number) => image.data[y * image.width + x];
  let sumIntensity = 0;
  let sumGradientSq = 0;
  let saturatedCount = 0;
  for (let y = rect.y; y < rect.y + rect.height; y++) {
    for (let x = rect.x; x < rect.x + rect.width; x++) {
      sumIntensity += at(x, y) - shift;
      if (at(x, y) >= level) saturatedCount++;
      if (y === rect.y || y === rect.y + rect.height - 1 || x === rect.x || x === rect.x + rect.width - 1) continue;
      const gx = at(x + 1, y - 1) + 2 * at(x + 1, y) + at(x + 1, y + 1) - (at(x - 1, y - 1) + 2 * at(x - 1, y) + at(x - 1, y + 1));
      const gy = at(x - 1, y + 1) - at(x - 1, y - 1) + 2 * (at(x, y + 1) - at(x, y - 1)) + (at(x + 1, y + 1) - at(x + 1, y - 1));
      sumGradientSq += gx * gx + gy * gy;
    }
  }
  return { sumIntensity, sumGradientSq, saturatedCount };
}

function referenceBoxReduce(image: GreyImage, factor: number, outWidth: number, outHeight: number): number[] {
  const out: number[] = [];
  for (let j = 0; j < outHeight; j++) {
    for (let i = 0; i < outWidth; i++) {
      let sum = 0;
      for (let dy = 0; dy < factor; dy++) for (let dx = 0; dx < factor; dx++) sum += image.data[(j * factor + dy) * image.width + i * factor + dx];
      out.push(Math.fround(sum / (factor * factor)));
    }
  }
  return out;
}

/** A seeded image: whole numbers up to maxValue, or fractional values when `fractional`. */
function seededImage(width: number, height: number, maxValue: number, fractional: boolean, seed: number): GreyImage {
  let state = seed >>> 0;
  const next = () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
  const data = new Float32Array(width * height);
  for (let i = 0; i < data.length; i++) data[i] = fractional ? next() * maxValue : Math.floor(next() * (maxValue + 1));
  return { width, height, data, maxValue };
}

describe('pixel kernels (WebAssembly) against plain JavaScript references', () => {
  const rects: [number, number, PixelRect][] = [
    [64, 48, { x: 0, y: 0, width: 64, height: 48 }],
    [65, 47, { x: 0, y: 0, width: 65, height: 47 }],
    [101, 80, { x: 7, y: 5, width: 33, height: 21 }],
    [40, 40, { x: 3, y: 2, width: 3, height: 3 }],
    [40, 40, { x: 1, y: 1, width: 4, height: 5 }],
  ];

  it('gives the same gradient sums to the last bit for whole-number pixels (8- and 16-bit)', () => {
    let clipped = 0;
    for (const [width, height, rect] of rects) {
      for (const maxValue of [255, 65535]) {
        const image = seededImage(width, height, maxValue, false, width * 31 + height + maxValue);
        const shift = image.data[(rect.y + (rect.height >> 1)) * width + rect.x + (rect.width >> 1)];
        const level = 0.98 * maxValue;
        const kernel = gradientEnergySums(image, rect, shift, level);
        const reference = referenceGradientSums(image, rect, shift, level);
        // Sums of whole numbers below 2^53 are exact in any order.
        expect(kernel).toEqual(reference);
        clipped += kernel.saturatedCount;
      }
    }
    // About 2 % of the pixels are at or above the level, so the count was exercised.
    expect(clipped).toBeGreaterThan(100);
  });

  it('agrees to 1e-12 relative for fractional pixels, and counts nothing as clipped at an infinite level', () => {
    for (const [width, height, rect] of rects) {
      const image = seededImage(width, height, 1, true, width + height);
      const kernel = gradientEnergySums(image, rect, 0.5, Infinity);
      const reference = referenceGradientSums(image, rect, 0.5, Infinity);
      expect(kernel.saturatedCount).toBe(0);
      expect(Math.abs(kernel.sumGradientSq - reference.sumGradientSq)).toBeLessThanOrEqual(1e-12 * reference.sumGradientSq);
      expect(Math.abs(kernel.sumIntensity - reference.sumIntensity)).toBeLessThanOrEqual(1e-12 * width * height);
    }
  });

  it('reduces by box means equal to the reference (whole numbers exactly, fractions to float32 rounding)', () => {
    for (const [width, height, factor] of [
      [64, 48, 4],
      [67, 50, 13],
      [300, 217, 13],
      [9, 9, 1],
      [31, 29, 3],
    ]) {
      const outWidth = Math.floor(width / factor);
      const outHeight = Math.floor(height / factor);
      const whole = seededImage(width, height, 255, false, factor * 7 + width);
      expect(Array.from(boxReduce(whole, factor, outWidth, outHeight))).toEqual(referenceBoxReduce(whole, factor, outWidth, outHeight));
      const fractional = seededImage(width, height, 1000, true, factor + height);
      const got = boxReduce(fractional, factor, outWidth, outHeight);
      const want = referenceBoxReduce(fractional, factor, outWidth, outHeight);
      want.forEach((value, i) => expect(Math.abs(got[i] - value)).toBeLessThanOrEqual(2 ** -20 * value));
    }
  });

  it('keeps working when a larger image makes the module grow its memory, and results are fresh copies', () => {
    const small = seededImage(30, 30, 255, false, 1);
    const first = boxReduce(small, 3, 10, 10);
    const big = seededImage(2100, 1600, 255, false, 2);
    const rect = { x: 0, y: 0, width: 2100, height: 1600 };
    expect(gradientEnergySums(big, rect, 0, 255)).toEqual(referenceGradientSums(big, rect, 0, 255));
    expect(Array.from(first)).toEqual(referenceBoxReduce(small, 3, 10, 10));
  });
});
