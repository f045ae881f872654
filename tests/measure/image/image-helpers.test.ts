import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { clampRect } from '../../../shared/measure/image/clamp-rect';
import { cropImage } from '../../../shared/measure/image/crop-image';
import {
  downsampleImage,
  reducedRectToFullResolution,
  reducedToFullResolutionPx,
} from '../../../shared/measure/image/downsample-image';
import { regionMean } from '../../../shared/measure/image/region-mean';
import { saturatedFraction } from '../../../shared/measure/image/saturated-fraction';
import type { GreyImage } from '../../../shared/measure/types';
import { loadOpenCv, type OpenCv } from './load-opencv';
import { addNoise, renderDots } from './render-scene';

/** value = x + 1000·y: every pixel says where it is. */
function coordinateImage(width: number, height: number): GreyImage {
  const data = new Float32Array(width * height);
  for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) data[y * width + x] = x + 1000 * y;
  return { width, height, data, maxValue: 65535 };
}

describe('clampRect', () => {
  it('keeps the part of a rect inside the image', () => {
    expect(clampRect({ x: -5, y: 10, width: 20, height: 100 }, 50, 40)).toEqual({ x: 0, y: 10, width: 15, height: 30 });
  });
  it('gives an empty rect for a rect wholly outside', () => {
    const rect = clampRect({ x: 60, y: 5, width: 10, height: 10 }, 50, 40);
    expect(rect.width).toBe(0);
  });
  it('rounds both ends of a fractional rect, so its size is kept', () => {
    expect(clampRect({ x: 10.4, y: 3.6, width: 20, height: 10 }, 100, 100)).toEqual({ x: 10, y: 4, width: 20, height: 10 });
  });
});

describe('cropImage', () => {
  const image = coordinateImage(30, 20);
  it('copies the pixels of the rect, with the rect corner at (0, 0)', () => {
    const crop = cropImage(image, { x: 7, y: 4, width: 5, height: 3 });
    expect(crop.width).toBe(5);
    expect(crop.height).toBe(3);
    expect(crop.data[0]).toBe(7 + 4000);
    expect(crop.data[2 * 5 + 4]).toBe(11 + 6000);
    expect(crop.maxValue).toBe(65535);
  });
  it('names a rect that leaves the image', () => {
    expect(() => cropImage(image, { x: 28, y: 0, width: 5, height: 3 })).toThrow(
      'rect (x=28, y=0, width=5, height=3) must lie inside the 30×20 image.',
    );
  });
});

describe('downsampleImage', () => {
  it('averages whole factor×factor blocks and drops the rest; reduced (u, v) sits at full u·f + (f − 1)/2', () => {
    const image = coordinateImage(35, 27);
    const reduced = downsampleImage(image, { factor: 4 });
    expect([reduced.width, reduced.height]).toEqual([8, 6]);
    for (const [u, v] of [[0, 0], [3, 2], [7, 5]]) {
      const x = reducedToFullResolutionPx(u, 4);
      const y = reducedToFullResolutionPx(v, 4);
      expect(reduced.data[v * 8 + u]).toBeCloseTo(x + 1000 * y, 3);
    }
    expect(reducedRectToFullResolution({ x: 2, y: 1, width: 3, height: 2 }, 4)).toEqual({ x: 8, y: 4, width: 12, height: 8 });
  });

  it('names a factor that is not a whole number', () => {
    expect(() => downsampleImage(coordinateImage(10, 10), { factor: 2.5 })).toThrow(
      'factor must be a whole number of at least 1 (got 2.5).',
    );
  });

  describe('against OpenCV resize with INTER_AREA (@techstark/opencv-js 4.5.2)', () => {
    let cv: OpenCv;
    beforeAll(async () => { cv = await loadOpenCv(); });
    afterAll(() => { cv = undefined; });

    it('equals cv.resize(INTER_AREA) for a whole factor to float precision', () => {
      const scene = addNoise(
        renderDots({ width: 96, height: 64, centresPx: [{ x: 30, y: 30 }], radiusPx: 9, sigmaPx: 1, backgroundLevel: 3000, targetLevel: 500 }),
        40,
        3,
      );
      const src = new cv.Mat(64, 96, cv.CV_32F);
      src.data32F.set(scene.data);
      const dst = new cv.Mat();
      cv.resize(src, dst, new cv.Size(12, 8), 0, 0, cv.INTER_AREA);
      const reference = Float32Array.from(dst.data32F);
      src.delete();
      dst.delete();
      const ours = downsampleImage(scene, { factor: 8 });
      for (let k = 0; k < reference.length; k++) {
        expect(Math.abs(ours.data[k] - reference[k]) / reference[k]).toBeLessThan(1e-6);
      }
    });
  });
});

describe('saturatedFraction and regionMean', () => {
  const image: GreyImage = { width: 4, height: 2, data: Float32Array.from([10, 250, 255, 20, 251, 249, 30, 40]), maxValue: 255 };
  it('counts pixels at or above 0.98 × maxValue by default (249.9 for 8-bit)', () => {
    expect(saturatedFraction(image)).toBe(3 / 8);
  });
  it('takes a threshold and a rect', () => {
    expect(saturatedFraction(image, { threshold: 200, rect: { x: 1, y: 0, width: 2, height: 2 } })).toBe(3 / 4);
  });
  it('regionMean is the mean over the rect', () => {
    expect(regionMean(image, { x: 0, y: 1, width: 2, height: 1 })).toBe(250);
    expect(regionMean(image)).toBe((10 + 250 + 255 + 20 + 251 + 249 + 30 + 40) / 8);
  });
});
