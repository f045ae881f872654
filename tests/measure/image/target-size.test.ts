import { describe, expect, it } from 'vitest';
import { clampRect } from '../../../shared/measure/image/clamp-rect';
import { cropImage } from '../../../shared/measure/image/crop-image';
import { downsampleImage } from '../../../shared/measure/image/downsample-image';
import { detectTarget } from '../../../shared/measure/target/detect-target';
import { measureDotPair } from '../../../shared/measure/target/measure-dot-pair';
import { measureSquare } from '../../../shared/measure/target/measure-square';
import { measureTargetSize } from '../../../shared/measure/target/measure-target-size';
import { scaleTargetDetection, shiftTargetDetection } from '../../../shared/measure/target/target-detection-coordinates';
import type { GreyImage, TargetPolarity } from '../../../shared/measure/types';
import { addNoise, applyVignetting, gaussianBlur, renderBlank, renderDots, renderSquare } from './render-scene';

const POLARITIES: TargetPolarity[] = ['dark-on-light', 'light-on-dark'];
const levels = (polarity: TargetPolarity) =>
  polarity === 'dark-on-light' ? { backgroundLevel: 3000, targetLevel: 300 } : { backgroundLevel: 200, targetLevel: 3500 };

describe('measureDotPair', () => {
  const truth = [{ x: 80.37, y: 100.21 }, { x: 201.83, y: 112.64 }];
  const trueSizePx = Math.hypot(truth[1].x - truth[0].x, truth[1].y - truth[0].y);
  const guess: [{ x: number; y: number }, { x: number; y: number }] = [{ x: 82, y: 99 }, { x: 200, y: 114 }];

  for (const polarity of POLARITIES) {
    it(`recovers the centre distance to 0.05 px and each centre to 0.02 px for blur σ = 0 … 6 px (${polarity})`, () => {
      const sharp = renderDots({ width: 280, height: 220, centresPx: truth, radiusPx: 15, sigmaPx: 0, maxValue: 4095, ...levels(polarity) });
      for (const sigmaPx of [0, 0.5, 1, 2, 3, 4, 5, 6]) {
        const image = sigmaPx > 0 ? gaussianBlur(sharp, sigmaPx) : sharp;
        const result = measureDotPair(image, { polarity, approximateCentresPx: guess, searchRadiusPx: 60 });
        expect(Math.abs(result.sizePx - trueSizePx)).toBeLessThan(0.05);
        result.centresPx.forEach((c, k) => expect(Math.hypot(c.x - truth[k].x, c.y - truth[k].y)).toBeLessThan(0.02));
      }
    });
  }

  it('stays within 0.05 px under noise (σn = 1 % of contrast) on a sloping background', () => {
    for (const sigmaPx of [1, 4]) {
      const image = renderDots({ width: 280, height: 220, centresPx: truth, radiusPx: 15, sigmaPx, maxValue: 4095, ...levels('dark-on-light') });
      for (let y = 0; y < image.height; y++) {
        for (let x = 0; x < image.width; x++) image.data[y * image.width + x] *= 1 - 0.001 * x + 0.0005 * y;
      }
      const noisy = addNoise(image, 27, 31 + sigmaPx);
      const result = measureDotPair(noisy, { polarity: 'dark-on-light', approximateCentresPx: guess, searchRadiusPx: 60 });
      expect(Math.abs(result.sizePx - trueSizePx)).toBeLessThan(0.05);
    }
  });

  it('names the dot it cannot find', () => {
    expect(() =>
      measureDotPair(renderBlank(200, 100, 1000), { polarity: 'dark-on-light', approximateCentresPx: [{ x: 50, y: 50 }, { x: 150, y: 50 }], searchRadiusPx: 30 }),
    ).toThrow('No dark-on-light dot found near (50.0, 50.0).');
  });

  it('names centres outside the image', () => {
    expect(() =>
      measureDotPair(renderBlank(200, 100, 1000), { polarity: 'dark-on-light', approximateCentresPx: [{ x: 50, y: 50 }, { x: 250, y: 50 }], searchRadiusPx: 30 }),
    ).toThrow('approximateCentresPx (250, 50) must lie inside the 200×100 image.');
  });
});

describe('measureSquare', () => {
  const sidePx = 180;
  const centrePx = { x: 151.3, y: 138.8 };
  const box = { x: 45, y: 35, width: 210, height: 205 };
  for (const polarity of POLARITIES) {
    for (const sigmaPx of [0, 2]) {
      it(`recovers the side to 0.1 % and the tilt to 0.02° for rotations 2°–10° (${polarity}, blur σ = ${sigmaPx} px)`, () => {
        for (const degrees of [2, 4, 6, 8, 10]) {
          const angleRad = (degrees * Math.PI) / 180;
          const image = renderSquare({
            width: 300, height: 280, centrePx, sidePx, angleRad, sigmaPx, maxValue: 4095, supersampling: sigmaPx > 0 ? 2 : 4, ...levels(polarity),
          });
          const result = measureSquare(image, { polarity, approximateBoundingBox: box });
          expect(Math.abs(result.sizePx / sidePx - 1)).toBeLessThan(0.001);
          expect(Math.abs(result.angleRad - angleRad)).toBeLessThan((0.02 * Math.PI) / 180);
          result.sideLengthsPx.forEach((length) => expect(Math.abs(length / sidePx - 1)).toBeLessThan(0.001));
        }
      });
    }
  }

  it('puts the corners within 0.05 px of the true corners', () => {
    const angleRad = (6 * Math.PI) / 180;
    const image = renderSquare({ width: 300, height: 280, centrePx, sidePx, angleRad, sigmaPx: 1, maxValue: 4095, ...levels('dark-on-light') });
    const result = measureSquare(image, { polarity: 'dark-on-light', approximateBoundingBox: box });
    const c = Math.cos(angleRad);
    const s = Math.sin(angleRad);
    const trueCorners = [[1, 1], [-1, 1], [-1, -1], [1, -1]].map(([u, v]) => ({
      x: centrePx.x + (sidePx / 2) * (u * c - v * s),
      y: centrePx.y + (sidePx / 2) * (u * s + v * c),
    }));
    for (const corner of result.cornersPx) {
      const nearest = Math.min(...trueCorners.map((t) => Math.hypot(t.x - corner.x, t.y - corner.y)));
      expect(nearest).toBeLessThan(0.05);
    }
  });

  it('stays within 0.1 % under noise (σn = 1 % of contrast) and blur σ = 4 px', () => {
    const blurredSquare = renderSquare({
      width: 300, height: 280, centrePx, sidePx, angleRad: 0.1, sigmaPx: 4, maxValue: 4095, supersampling: 2, ...levels('light-on-dark'),
    });
    for (const seed of [41, 42, 43]) {
      const result = measureSquare(addNoise(blurredSquare, 33, seed), { polarity: 'light-on-dark', approximateBoundingBox: box });
      expect(Math.abs(result.sizePx / sidePx - 1)).toBeLessThan(0.001);
    }
  });

  it('names a polarity the image does not show', () => {
    const image = renderSquare({ width: 300, height: 280, centrePx, sidePx, angleRad: 0.1, sigmaPx: 1, maxValue: 4095, supersampling: 1, ...levels('light-on-dark') });
    expect(() => measureSquare(image, { polarity: 'dark-on-light', approximateBoundingBox: box })).toThrow(
      'No dark-on-light square found in approximateBoundingBox (x=45, y=35, width=210, height=205).',
    );
  });
});

describe('measureTargetSize from a reduced-copy detection to a full-resolution crop', () => {
  const FACTOR = 8;

  function measureFrame(frame: GreyImage, pattern: 'dot-pair' | 'square') {
    const found = detectTarget(downsampleImage(frame, { factor: FACTOR }), { pattern });
    expect(found).not.toBeNull();
    const full = scaleTargetDetection(found!, { factor: FACTOR });
    const extent = full.blurExtentBox;
    const margin = Math.round(0.3 * Math.max(extent.width, extent.height));
    const region = clampRect(
      { x: extent.x - margin, y: extent.y - margin, width: extent.width + 2 * margin, height: extent.height + 2 * margin },
      frame.width,
      frame.height,
    );
    const detection = shiftTargetDetection(full, { originPx: region });
    return measureTargetSize(cropImage(frame, region), { pattern, polarity: full.polarity, detection });
  }

  it('measures a blurred, vignetted, noisy dot pair to 0.05 px and describes it for an overlay', () => {
    const centres = [{ x: 500.3, y: 420.7 }, { x: 720.1, y: 470.2 }];
    const frame = addNoise(
      applyVignetting(renderDots({ width: 1200, height: 900, centresPx: centres, radiusPx: 40, sigmaPx: 5, backgroundLevel: 40000, targetLevel: 6000, supersampling: 4 }), 2500),
      300,
      51,
    );
    const result = measureFrame(frame, 'dot-pair');
    expect(Math.abs(result.sizePx - Math.hypot(219.8, 49.5))).toBeLessThan(0.05);
    expect(result.overlay.pattern).toBe('dot-pair');
    expect(JSON.parse(JSON.stringify(result.overlay))).toEqual(result.overlay);
    if (result.overlay.pattern === 'dot-pair') {
      result.overlay.dots.forEach((dot) => expect(Math.abs(dot.radiusPx - 40)).toBeLessThan(4));
    }
  });

  it('measures a blurred, vignetted, noisy square to 0.1 % and gives its four corners for an overlay', () => {
    const frame = addNoise(
      applyVignetting(renderSquare({ width: 1200, height: 900, centrePx: { x: 610.4, y: 430.9 }, sidePx: 300, angleRad: 0.07, sigmaPx: 3, backgroundLevel: 1500, targetLevel: 36000, supersampling: 2 }), 2500),
      300,
      52,
    );
    const result = measureFrame(frame, 'square');
    expect(Math.abs(result.sizePx / 300 - 1)).toBeLessThan(0.001);
    expect(result.overlay.pattern === 'square' && result.overlay.cornersPx.length).toBe(4);
  });
});
