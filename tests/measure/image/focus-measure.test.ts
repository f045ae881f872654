import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { focusMeasure, focusMeasures, FOCUS_OPERATORS } from '../../../shared/measure/focus/focus-measure';
import { estimateNoiseFloor } from '../../../shared/measure/focus/estimate-noise-floor';
import type { GreyImage, PixelRect } from '../../../shared/measure/types';
import { addNoise, renderDots, renderEdge, scaleIntensity } from './render-scene';
import { loadOpenCv, type OpenCv } from './load-opencv';

const SIGMAS_PX = [0.5, 0.75, 1, 1.5, 2, 3, 4, 5, 6, 8];

function edgeScene(sigmaPx: number): GreyImage {
  return renderEdge({
    width: 160, height: 120, normalAngleRad: (5 * Math.PI) / 180, edgePointPx: { x: 80.3, y: 60 },
    sigmaPx, backgroundLevel: 800, targetLevel: 3000, maxValue: 4095, supersampling: 4,
  });
}

function dotPairScene(sigmaPx: number): GreyImage {
  return renderDots({
    width: 160, height: 120, centresPx: [{ x: 55.2, y: 60.4 }, { x: 104.7, y: 59.1 }], radiusPx: 10,
    sigmaPx, backgroundLevel: 3000, targetLevel: 400, maxValue: 4095,
  });
}

/** A noisy edge whose values are multiples of 10, so that ×1.3 stays exact in Float32. */
function textureScene(): GreyImage {
  const noisy = addNoise(edgeScene(1.2), 25, 7);
  for (let k = 0; k < noisy.data.length; k++) noisy.data[k] = 10 * Math.round(noisy.data[k] / 10);
  return noisy;
}

/** Copies the image's pixels (exactly) into a CV_64F Mat; the caller deletes it. opencv.js 4.5.2
 * throws on Laplacian from CV_32F to CV_64F, so the source is widened first. */
function toMat(cv: OpenCv, image: GreyImage, rect: PixelRect) {
  const mat = new cv.Mat(rect.height, rect.width, cv.CV_64F);
  for (let y = 0; y < rect.height; y++) {
    const start = (rect.y + y) * image.width + rect.x;
    mat.data64F.set(image.data.subarray(start, start + rect.width), y * rect.width);
  }
  return mat;
}

/** Mean and population variance over the interior (1-pixel border excluded) of a CV_64F Mat. */
function interiorMeanVariance(cv: OpenCv, mat: OpenCv) {
  const interior = mat.roi(new cv.Rect(1, 1, mat.cols - 2, mat.rows - 2));
  const mean = new cv.Mat();
  const stdDev = new cv.Mat();
  cv.meanStdDev(interior, mean, stdDev);
  const result = { mean: mean.doubleAt(0, 0), variance: stdDev.doubleAt(0, 0) ** 2 };
  interior.delete(); mean.delete(); stdDev.delete();
  return result;
}

describe('focus measures against OpenCV (@techstark/opencv-js 4.5.2, a general-purpose reference library)', () => {
  let cv: OpenCv;
  beforeAll(async () => { cv = await loadOpenCv(); });
  afterAll(() => { cv = undefined; });

  const image = textureScene();
  const rects: PixelRect[] = [
    { x: 0, y: 0, width: image.width, height: image.height },
    { x: 37, y: 21, width: 71, height: 58 },
  ];

  for (const rect of rects) {
    it(`laplacian-variance equals cv.Laplacian(ksize 1, CV_64F) + cv.meanStdDev on the interior of ${rect.width}×${rect.height}`, () => {
      const src = toMat(cv, image, rect);
      const laplacian = new cv.Mat();
      cv.Laplacian(src, laplacian, cv.CV_64F, 1);
      const reference = interiorMeanVariance(cv, laplacian).variance;
      src.delete(); laplacian.delete();
      const ours = focusMeasure(image, { operator: 'laplacian-variance', rect, normalise: false });
      expect(reference).toBeGreaterThan(0);
      expect(Math.abs(ours - reference) / reference).toBeLessThan(1e-9);
    });

    it(`gradient-energy equals the interior mean of cv.Sobel(dx)² + cv.Sobel(dy)² (ksize 3) on ${rect.width}×${rect.height}`, () => {
      const src = toMat(cv, image, rect);
      const gx = new cv.Mat();
      const gy = new cv.Mat();
      cv.Sobel(src, gx, cv.CV_64F, 1, 0, 3);
      cv.Sobel(src, gy, cv.CV_64F, 0, 1, 3);
      const energy = new cv.Mat();
      const gy2 = new cv.Mat();
      cv.multiply(gx, gx, energy);
      cv.multiply(gy, gy, gy2);
      cv.add(energy, gy2, energy);
      const reference = interiorMeanVariance(cv, energy).mean;
      [src, gx, gy, energy, gy2].forEach((m) => m.delete());
      const ours = focusMeasure(image, { operator: 'gradient-energy', rect, normalise: false });
      expect(Math.abs(ours - reference) / reference).toBeLessThan(1e-9);
    });

    it(`brenner equals the interior mean of the squared [−1 0 1] responses along x and y (cv.filter2D) on ${rect.width}×${rect.height}`, () => {
      const src = toMat(cv, image, rect);
      const kx = cv.matFromArray(1, 3, cv.CV_64F, [-1, 0, 1]);
      const ky = cv.matFromArray(3, 1, cv.CV_64F, [-1, 0, 1]);
      const dx = new cv.Mat();
      const dy = new cv.Mat();
      cv.filter2D(src, dx, cv.CV_64F, kx);
      cv.filter2D(src, dy, cv.CV_64F, ky);
      const sum = new cv.Mat();
      const dy2 = new cv.Mat();
      cv.multiply(dx, dx, sum);
      cv.multiply(dy, dy, dy2);
      cv.add(sum, dy2, sum);
      const reference = interiorMeanVariance(cv, sum).mean;
      [src, kx, ky, dx, dy, sum, dy2].forEach((m) => m.delete());
      const ours = focusMeasure(image, { operator: 'brenner', rect, normalise: false });
      expect(Math.abs(ours - reference) / reference).toBeLessThan(1e-9);
    });

    it(`normalised-variance equals cv.meanStdDev variance / mean over all of ${rect.width}×${rect.height}`, () => {
      const src = toMat(cv, image, rect);
      const mean = new cv.Mat();
      const stdDev = new cv.Mat();
      cv.meanStdDev(src, mean, stdDev);
      const reference = stdDev.doubleAt(0, 0) ** 2 / mean.doubleAt(0, 0);
      [src, mean, stdDev].forEach((m) => m.delete());
      const ours = focusMeasure(image, { operator: 'normalised-variance', rect, normalise: false });
      expect(Math.abs(ours - reference) / reference).toBeLessThan(1e-9);
    });
  }
});

describe('focus measures fall as blur grows (Pertuz et al., Pattern Recognition 46 (2013) 1415–1432)', () => {
  for (const [sceneName, scene] of [['a 5°-slanted edge', edgeScene], ['a dot pair', dotPairScene]] as const) {
    const images = SIGMAS_PX.map(scene);
    for (const operator of FOCUS_OPERATORS) {
      it(`${operator} falls strictly for ${sceneName} blurred by σ = ${SIGMAS_PX.join(', ')} px`, () => {
        const values = images.map((image) => focusMeasure(image, { operator }));
        for (let k = 1; k < values.length; k++) expect(values[k]).toBeLessThan(values[k - 1]);
      });
    }
  }
});

describe('normalisation', () => {
  const image = textureScene();
  const brighter = scaleIntensity(image, 1.3);
  for (const operator of FOCUS_OPERATORS) {
    it(`normalised ${operator} is unchanged to 1e-9 when the exposure is scaled by 1.3`, () => {
      const before = focusMeasure(image, { operator });
      const after = focusMeasure(brighter, { operator });
      expect(Math.abs(after - before) / before).toBeLessThan(1e-9);
      const rawBefore = focusMeasure(image, { operator, normalise: false });
      const rawAfter = focusMeasure(brighter, { operator, normalise: false });
      expect(Math.abs(rawAfter / rawBefore - 1)).toBeGreaterThan(0.2);
    });
  }

  it('focusMeasures gives the same value as focusMeasure for each operator', () => {
    const rect = { x: 10, y: 12, width: 90, height: 70 };
    const set = focusMeasures(image, { rect });
    for (const operator of FOCUS_OPERATORS) {
      expect(set.measures[operator]).toBe(focusMeasure(image, { operator, rect }));
    }
    expect(set.interiorPixelCount).toBe(88 * 68);
  });

  it('noiseFloor is subtracted from the normalised value', () => {
    const a = focusMeasure(image, { operator: 'brenner' });
    const b = focusMeasure(image, { operator: 'brenner', noiseFloor: 1e-4 });
    expect(a - b).toBeCloseTo(1e-4, 12);
  });
});

describe('estimateNoiseFloor', () => {
  const clean = renderEdge({
    width: 200, height: 200, normalAngleRad: 0.09, edgePointPx: { x: 100.3, y: 100 }, sigmaPx: 1,
    backgroundLevel: 800, targetLevel: 3000, maxValue: 4095, supersampling: 4,
  });
  const background: PixelRect = { x: 2, y: 2, width: 60, height: 196 };
  // Noise levels chosen so that noise inflates each measure by 10–30 %.
  const noiseStdDevFor = { 'gradient-energy': 40, 'laplacian-variance': 5, brenner: 40, 'normalised-variance': 400 } as const;
  for (const operator of FOCUS_OPERATORS) {
    const noiseStdDev = noiseStdDevFor[operator];
    it(`subtracting the estimated floor brings the ${operator} of a noisy (σn = ${noiseStdDev}) edge back to its noise-free value within 2 %`, () => {
      const truth = focusMeasure(clean, { operator });
      for (const seed of [11, 12, 13]) {
        const noisy = addNoise(clean, noiseStdDev, seed);
        const raw = focusMeasure(noisy, { operator });
        const estimate = estimateNoiseFloor(noisy, { operator, backgroundRect: background });
        expect(Math.abs(estimate.noiseStdDev / noiseStdDev - 1)).toBeLessThan(0.05);
        expect(raw / truth - 1).toBeGreaterThan(0.08);
        expect(Math.abs(focusMeasure(noisy, { operator, noiseFloor: estimate.noiseFloor }) / truth - 1)).toBeLessThan(0.02);
      }
    });
  }
});

describe('option checks', () => {
  const image = edgeScene(1);
  it('names a bad operator', () => {
    // @ts-expect-error testing a wrong value
    expect(() => focusMeasure(image, { operator: 'sharpness' })).toThrow(
      'operator must be one of gradient-energy, laplacian-variance, brenner, normalised-variance (got sharpness).',
    );
  });
  it('names a rect outside the image', () => {
    expect(() => focusMeasure(image, { operator: 'brenner', rect: { x: 100, y: 0, width: 100, height: 10 } })).toThrow(
      'rect (x=100, y=0, width=100, height=10) must lie inside the 160×120 image.',
    );
  });
  it('names a rect too small for the 3×3 kernels', () => {
    expect(() => focusMeasure(image, { operator: 'brenner', rect: { x: 0, y: 0, width: 2, height: 10 } })).toThrow(
      'rect (x=0, y=0, width=2, height=10) must be at least 3×3 pixels.',
    );
  });
  it('refuses a black region, which has no intensity to normalise by', () => {
    const black = { width: 10, height: 10, data: new Float32Array(100), maxValue: 255 };
    expect(() => focusMeasure(black, { operator: 'gradient-energy' })).toThrow(
      "The region's mean intensity is 0; focus measures need a positive mean intensity (is the frame black?).",
    );
  });
  it('names a negative noise floor', () => {
    expect(() => focusMeasure(image, { operator: 'brenner', noiseFloor: -1 })).toThrow(
      'noiseFloor must be a finite number of at least 0 (got -1).',
    );
  });
});
