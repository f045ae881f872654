import { describe, expect, it } from 'vitest';
import type { GreyImage } from '../types';
import { discWindowMoments, dotSignalCovers, dotSignalOver, planeLevelAt, ringSignalSums } from './dot-signal';

function lehmer(seed: number) {
  let state = seed;
  return () => (state = (state * 48271) % 2147483647) / 2147483647;
}

/** A lit, sloping background with a dark dot and noise; whole-number levels like a camera's. */
function scene(random: () => number, width: number, height: number): GreyImage {
  const data = new Float32Array(width * height);
  const dot = { x: width * (0.3 + 0.4 * random()), y: height * (0.3 + 0.4 * random()), r: 6 + 6 * random() };
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const background = 900 + 0.8 * x - 0.5 * y;
      const inside = Math.hypot(x - dot.x, y - dot.y) < dot.r ? 0.2 : 1;
      data[y * width + x] = Math.round(background * inside + 20 * (random() - 0.5));
    }
  }
  return { width, height, data, maxValue: 4095 };
}

const plane = { offset: 900, slopeX: 0.8, slopeY: -0.5 };
const signalAt = (image: GreyImage, sign: number, x: number, y: number) => {
  const value = image.data[y * image.width + x];
  const background = plane.offset + plane.slopeY * y + plane.slopeX * x;
  return sign > 0 ? value - background : (background - value) / background;
};

describe('dot signal sums', () => {
  it('discWindowMoments equals the per-pixel sum of coverage × signal and its first moments, for either polarity', () => {
    const random = lehmer(7);
    for (let trial = 0; trial < 40; trial++) {
      const image = scene(random, 90, 70);
      const sign = trial % 2 ? 1 : -1;
      const cx = 20 + 50 * random();
      const cy = 20 + 30 * random();
      const reach = 3 + 25 * random();
      const dot = dotSignalOver(image, plane, sign, cx + 2 * random() - 1, cy + 2 * random() - 1, reach + 6, 0);
      expect(dotSignalCovers(dot, cx, cy, reach)).toBe(true);
      const moments = new Float64Array(3);
      discWindowMoments(dot, image, cx, cy, reach, moments);
      // Reference: every pixel, weight clip(reach − distance, 0, 1) (the window's definition).
      let mass = 0;
      let mx = 0;
      let my = 0;
      for (let y = 0; y < image.height; y++) {
        for (let x = 0; x < image.width; x++) {
          const weight = Math.min(1, Math.max(0, reach - Math.hypot(x - cx, y - cy)));
          if (weight === 0) continue;
          const s = signalAt(image, sign, x, y) * weight;
          mass += s;
          mx += s * (x - cx);
          my += s * (y - cy);
        }
      }
      const scale = Math.max(1e-9, Math.abs(mass));
      expect(Math.abs(moments[0] - mass) / scale).toBeLessThan(1e-9);
      expect(Math.abs(moments[1] - mx) / (scale * reach)).toBeLessThan(1e-9);
      expect(Math.abs(moments[2] - my) / (scale * reach)).toBeLessThan(1e-9);
    }
  });

  it('ringSignalSums gives each ring floor(distance) its pixel count exactly and its signal sum to rounding', () => {
    const random = lehmer(11);
    for (let trial = 0; trial < 40; trial++) {
      const image = scene(random, 80, 60);
      const cx = 10 + 60 * random();
      const cy = 10 + 40 * random();
      const ringCount = 1 + Math.floor(30 * random());
      const dot = dotSignalOver(image, plane, 1, cx, cy, ringCount + 2, 1);
      const sums = new Float64Array(ringCount);
      const counts = new Float64Array(ringCount);
      ringSignalSums(dot, image, cx, cy, sums, counts);
      const expectedSums = new Float64Array(ringCount);
      const expectedCounts = new Float64Array(ringCount);
      for (let y = 0; y < image.height; y++) {
        for (let x = 0; x < image.width; x++) {
          const ring = Math.floor(Math.sqrt((x - cx) ** 2 + (y - cy) ** 2));
          if (ring >= ringCount) continue;
          expectedSums[ring] += signalAt(image, 1, x, y);
          expectedCounts[ring]++;
        }
      }
      expect(Array.from(counts)).toEqual(Array.from(expectedCounts));
      for (let ring = 0; ring < ringCount; ring++) expect(sums[ring]).toBeCloseTo(expectedSums[ring], 6);
    }
  });

  it('dotSignalCovers turns false once the window reaches past the filled disc', () => {
    const image = scene(lehmer(3), 80, 60);
    const dot = dotSignalOver(image, plane, -1, 40, 30, 20, 0);
    expect(dotSignalCovers(dot, 40, 30, 18)).toBe(true);
    expect(dotSignalCovers(dot, 41, 30, 18)).toBe(false);
    expect(dotSignalCovers(dot, 40, 30, 19)).toBe(false);
  });

  it('planeLevelAt evaluates the plane', () => {
    expect(planeLevelAt(plane, 10, 20)).toBeCloseTo(900 + 8 - 10, 12);
  });
});
