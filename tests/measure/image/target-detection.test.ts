import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { downsampleImage } from '../../../shared/measure/image/downsample-image';
import { detectTarget } from '../../../shared/measure/target/detect-target';
import { histogram } from '../../../shared/measure/target/histogram';
import { labelComponents } from '../../../shared/measure/target/label-components';
import { otsuThreshold } from '../../../shared/measure/target/otsu-threshold';
import { scaleTargetDetection, shiftTargetDetection } from '../../../shared/measure/target/target-detection-coordinates';
import type { GreyImage } from '../../../shared/measure/types';
import { loadOpenCv, type OpenCv } from './load-opencv';
import { addNoise, applyVignetting, renderBlank, renderDots, renderSquare, seededRandom } from './render-scene';

const FACTOR = 8;
const DOT_CENTRES = [{ x: 500.3, y: 420.7 }, { x: 720.1, y: 470.2 }];

function dotPairFrame({ sigmaPx = 2, dark = true, seed = 1, centres = DOT_CENTRES } = {}): GreyImage {
  const sharp = renderDots({
    width: 1200, height: 900, centresPx: centres, radiusPx: 40, sigmaPx,
    backgroundLevel: dark ? 40000 : 3000, targetLevel: dark ? 6000 : 42000, supersampling: 2,
  });
  return addNoise(applyVignetting(sharp, 900), 1200, seed);
}

function squareFrame({ dark = false, seed = 2, sigmaPx = 4 } = {}): GreyImage {
  const sharp = renderSquare({
    width: 1200, height: 900, centrePx: { x: 610.4, y: 430.9 }, sidePx: 300, angleRad: 0.12, sigmaPx,
    backgroundLevel: dark ? 38000 : 1500, targetLevel: dark ? 4000 : 36000, supersampling: 1,
  });
  return addNoise(applyVignetting(sharp, 900), 900, seed);
}

function toUint8(image: GreyImage, scale: number): Uint8Array {
  return Uint8Array.from(image.data, (v) => Math.max(0, Math.min(255, Math.round(v * scale))));
}

describe('Otsu threshold and component labelling against OpenCV (@techstark/opencv-js 4.5.2)', () => {
  let cv: OpenCv;
  beforeAll(async () => { cv = await loadOpenCv(); });
  afterAll(() => { cv = undefined; });

  const scenes: [string, Uint8Array, number, number][] = [
    ['a noisy dot pair', toUint8(downsampleImage(dotPairFrame(), { factor: 4 }), 255 / 44000), 300, 225],
    ['a noisy bright square', toUint8(downsampleImage(squareFrame(), { factor: 4 }), 255 / 40000), 300, 225],
  ];
  for (const [name, pixels, width, height] of scenes) {
    it(`otsuThreshold on a 256-bin histogram picks the threshold cv.threshold(THRESH_OTSU) picks for ${name}`, () => {
      const src = cv.matFromArray(height, width, cv.CV_8UC1, Array.from(pixels));
      const dst = new cv.Mat();
      const reference = cv.threshold(src, dst, 0, 255, cv.THRESH_BINARY + cv.THRESH_OTSU);
      src.delete();
      dst.delete();
      const { counts } = histogram(pixels, { binCount: 256, lowerValue: 0, upperValue: 256 });
      const ours = otsuThreshold(counts);
      expect(ours).not.toBeNull();
      expect(ours!.thresholdBin).toBe(reference);
    });
  }

  it('labelComponents finds the components, areas and boxes cv.connectedComponentsWithStats finds (8-connectivity)', () => {
    const width = 120;
    const height = 90;
    const random = seededRandom(5);
    const mask = Uint8Array.from({ length: width * height }, () => (random() < 0.45 ? 1 : 0));
    const src = cv.matFromArray(height, width, cv.CV_8UC1, Array.from(mask));
    const labels = new cv.Mat();
    const stats = new cv.Mat();
    const centroids = new cv.Mat();
    const count = cv.connectedComponentsWithStats(src, labels, stats, centroids, 8, cv.CV_32S);
    const reference: string[] = [];
    for (let k = 1; k < count; k++) {
      const s = Array.from({ length: 5 }, (_, c) => stats.intAt(k, c));
      reference.push(`${s[4]}@${s[0]},${s[1]},${s[2]},${s[3]}`);
    }
    [src, labels, stats, centroids].forEach((m) => m.delete());
    const ours = labelComponents(mask, { width, height }).components.map(
      (c) => `${c.areaPx}@${c.boundingBox.x},${c.boundingBox.y},${c.boundingBox.width},${c.boundingBox.height}`,
    );
    expect(reference.length).toBeGreaterThan(50);
    expect(ours.sort()).toEqual(reference.sort());
  });
});

describe('otsuThreshold and labelComponents contracts', () => {
  it('otsuThreshold splits two equal, well-separated modes between them and reports a high separability', () => {
    const counts = new Float64Array(100);
    for (let k = 0; k < 100; k++) counts[k] = Math.exp(-(((k - 25) / 4) ** 2)) + Math.exp(-(((k - 75) / 4) ** 2));
    const result = otsuThreshold(counts)!;
    expect(result.thresholdBin).toBeGreaterThanOrEqual(40);
    expect(result.thresholdBin).toBeLessThanOrEqual(60);
    expect(result.separability).toBeGreaterThan(0.9);
  });
  it('otsuThreshold returns null when only one bin is occupied', () => {
    expect(otsuThreshold([0, 0, 12, 0])).toBeNull();
  });
  it('labelComponents joins pixels that touch only at a corner', () => {
    const { components } = labelComponents([1, 0, 0, 0, 1, 0, 0, 0, 1], { width: 3, height: 3 });
    expect(components).toHaveLength(1);
    expect(components[0].areaPx).toBe(3);
    expect(components[0].touchesBorder).toBe(true);
  });
});

describe('detectTarget on a reduced copy (8×)', () => {
  it('finds a dark dot pair under cos⁴ vignetting and noise, detects its polarity, and places each dot within 1 px at full resolution', () => {
    const reduced = downsampleImage(dotPairFrame(), { factor: FACTOR });
    const found = detectTarget(reduced, { pattern: 'dot-pair' });
    expect(found).not.toBeNull();
    expect(found!.polarity).toBe('dark-on-light');
    const full = scaleTargetDetection(found!, { factor: FACTOR });
    const centres = full.blobs.map((b) => b.centroidPx).sort((a, b) => a.x - b.x);
    centres.forEach((c, k) => expect(Math.hypot(c.x - DOT_CENTRES[k].x, c.y - DOT_CENTRES[k].y)).toBeLessThan(1));
    const box = full.boundingBox;
    expect(box.x).toBeLessThan(DOT_CENTRES[0].x - 30);
    expect(box.x + box.width).toBeGreaterThan(DOT_CENTRES[1].x + 30);
  });

  it('finds a bright dot pair and calls it light-on-dark', () => {
    const found = detectTarget(downsampleImage(dotPairFrame({ dark: false, seed: 4 }), { factor: FACTOR }), { pattern: 'dot-pair' });
    expect(found?.polarity).toBe('light-on-dark');
  });

  it('finds a heavily blurred dot pair (σ = 0.6 × dot radius) and reports a blur extent wider than its half-contrast box', () => {
    const frame = addNoise(
      renderDots({ width: 800, height: 600, centresPx: [{ x: 320.3, y: 280.7 }, { x: 480.1, y: 310.2 }], radiusPx: 27, sigmaPx: 16, backgroundLevel: 40000, targetLevel: 6000, supersampling: 1 }),
      600,
      6,
    );
    const found = detectTarget(downsampleImage(frame, { factor: FACTOR }), { pattern: 'dot-pair' });
    expect(found).not.toBeNull();
    expect(found!.blurExtentBox.width).toBeGreaterThan(found!.boundingBox.width + 2);
    expect(found!.blurExtentBox.height).toBeGreaterThan(found!.boundingBox.height + 2);
  });

  for (const dark of [false, true]) {
    it(`finds a tilted ${dark ? 'dark' : 'bright'} square under vignetting and noise, centred within 1 px at full resolution`, () => {
      const found = detectTarget(downsampleImage(squareFrame({ dark, seed: dark ? 8 : 9 }), { factor: FACTOR }), { pattern: 'square' });
      expect(found).not.toBeNull();
      expect(found!.polarity).toBe(dark ? 'dark-on-light' : 'light-on-dark');
      const full = scaleTargetDetection(found!, { factor: FACTOR });
      expect(Math.hypot(full.centrePx.x - 610.4, full.centrePx.y - 430.9)).toBeLessThan(1);
    });
  }

  it('finds dots only about 2 reduced pixels across, a class too small for Otsu’s criterion alone', () => {
    const centres = [{ x: 700.3, y: 520.7 }, { x: 900.1, y: 560.2 }];
    const frame = addNoise(
      renderDots({ width: 1600, height: 1200, centresPx: centres, radiusPx: 9, sigmaPx: 2, backgroundLevel: 40000, targetLevel: 6000, supersampling: 1 }),
      800,
      15,
    );
    const found = detectTarget(downsampleImage(frame, { factor: FACTOR }), { pattern: 'dot-pair' });
    expect(found).not.toBeNull();
    const full = scaleTargetDetection(found!, { factor: FACTOR });
    const located = full.blobs.map((b) => b.centroidPx).sort((a, b) => a.x - b.x);
    located.forEach((c, k) => expect(Math.hypot(c.x - centres[k].x, c.y - centres[k].y)).toBeLessThan(2));
  });

  it('returns null on frames of pure noise', () => {
    for (const seed of [21, 22, 23]) {
      const noise = downsampleImage(addNoise(renderBlank(1200, 900, 20000), 3000, seed), { factor: FACTOR });
      expect(detectTarget(noise, { pattern: 'dot-pair' })).toBeNull();
      expect(detectTarget(noise, { pattern: 'square' })).toBeNull();
    }
  });

  it('returns null on a blank frame, flat or vignetted, with or without noise', () => {
    const flat = renderBlank(1200, 900, 30000);
    for (const frame of [flat, applyVignetting(flat, 900), addNoise(applyVignetting(flat, 900), 500, 3)]) {
      const reduced = downsampleImage(frame, { factor: FACTOR });
      expect(detectTarget(reduced, { pattern: 'dot-pair' })).toBeNull();
      expect(detectTarget(reduced, { pattern: 'square' })).toBeNull();
    }
  });

  it('returns null for a dot pair when three similar dots are present', () => {
    const frame = dotPairFrame({ centres: [...DOT_CENTRES, { x: 300, y: 600 }], seed: 12 });
    expect(detectTarget(downsampleImage(frame, { factor: FACTOR }), { pattern: 'dot-pair' })).toBeNull();
  });

  it('returns null for a square when the frame holds a dot pair, and for the wrong stated polarity', () => {
    const dots = downsampleImage(dotPairFrame({ seed: 13 }), { factor: FACTOR });
    expect(detectTarget(dots, { pattern: 'square' })).toBeNull();
    expect(detectTarget(dots, { pattern: 'dot-pair', polarity: 'light-on-dark' })).toBeNull();
  });

  it('names a bad pattern', () => {
    // @ts-expect-error testing a wrong value
    expect(() => detectTarget(renderBlank(20, 20, 1), { pattern: 'cross' })).toThrow(
      'pattern must be one of dot-pair, square (got cross).',
    );
  });

  it('shiftTargetDetection moves every coordinate into a crop', () => {
    const found = detectTarget(downsampleImage(dotPairFrame({ seed: 14 }), { factor: FACTOR }), { pattern: 'dot-pair' })!;
    const moved = shiftTargetDetection(found, { originPx: { x: 10, y: 5 } });
    expect(moved.centrePx.x).toBeCloseTo(found.centrePx.x - 10, 12);
    expect(moved.blobs[1].boundingBox.y).toBe(found.blobs[1].boundingBox.y - 5);
    expect(moved.blurExtentBox.x).toBe(found.blurExtentBox.x - 10);
  });
});
