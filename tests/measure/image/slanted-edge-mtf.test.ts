import { describe, expect, it } from 'vitest';
import { clampRect } from '../../../shared/measure/image/clamp-rect';
import { slantedEdgeMtf } from '../../../shared/measure/mtf/slanted-edge-mtf';
import { squareEdgeRects } from '../../../shared/measure/mtf/square-edge-rects';
import { measureSquare } from '../../../shared/measure/target/measure-square';
import { addNoise, renderBlank, renderEdge, renderSquare } from './render-scene';

/**
 * Analytic reference: a Gaussian blur of σ px has MTF exp(−2π²σ²f²) (the Fourier
 * transform of a Gaussian), so MTF50 = √(ln 2 / (2π²σ²)) ≈ 0.1874/σ cycles/pixel.
 * The scenes are point-sampled after the blur (supersampling 1), so no pixel-
 * aperture sinc(f) enters and the Gaussian is the whole MTF.
 */
const gaussianMtf = (sigmaPx: number, f: number) => Math.exp(-2 * Math.PI ** 2 * sigmaPx ** 2 * f * f);
const gaussianMtf50 = (sigmaPx: number) => Math.sqrt(Math.LN2 / (2 * Math.PI ** 2 * sigmaPx ** 2));

const SIGMAS_PX = [1, 1.5, 2, 3];

function slantedEdge(sigmaPx: number, normalAngleDeg: number) {
  return renderEdge({
    width: 128, height: 128, normalAngleRad: (normalAngleDeg * Math.PI) / 180, edgePointPx: { x: 64.2, y: 63.7 },
    sigmaPx, backgroundLevel: 500, targetLevel: 3500, maxValue: 4095, supersampling: 1,
  });
}

describe('slantedEdgeMtf (ISO 12233:2017 e-SFR)', () => {
  for (const [normalAngleDeg, label] of [[5, 'near-vertical'], [-85, 'near-horizontal'], [185, 'near-vertical, falling']] as const) {
    it(`finds MTF50 of a 5°-slanted ${label} edge within 1 % of 0.1874/σ for σ = ${SIGMAS_PX.join(', ')} px`, () => {
      for (const sigmaPx of SIGMAS_PX) {
        const result = slantedEdgeMtf(slantedEdge(sigmaPx, normalAngleDeg));
        expect(result.mtf50BeyondRange).toBe(false);
        expect(Math.abs(result.mtf50CyclesPerPixel / gaussianMtf50(sigmaPx) - 1)).toBeLessThan(0.01);
        expect(Math.abs(Math.abs(result.edgeAngleRad) - (5 * Math.PI) / 180)).toBeLessThan(0.001);
        expect(result.edgeOrientation).toBe(label.startsWith('near-vertical') ? 'near-vertical' : 'near-horizontal');
      }
    });
  }

  it('follows exp(−2π²σ²f²) to 0.01 at every frequency up to 0.5 cycles/pixel (the derivative correction included)', () => {
    for (const sigmaPx of SIGMAS_PX) {
      const result = slantedEdgeMtf(slantedEdge(sigmaPx, 5));
      result.frequenciesCyclesPerPixel.forEach((f, j) => {
        if (f <= 0.5) expect(Math.abs(result.mtf[j] - gaussianMtf(sigmaPx, f))).toBeLessThan(0.01);
      });
    }
  });

  it('stays within 3 % of 0.1874/σ with noise of 0.5 % of the step', () => {
    for (const sigmaPx of SIGMAS_PX) {
      const result = slantedEdgeMtf(addNoise(slantedEdge(sigmaPx, 5), 15, 60 + sigmaPx));
      expect(Math.abs(result.mtf50CyclesPerPixel / gaussianMtf50(sigmaPx) - 1)).toBeLessThan(0.03);
    }
  });

  it('gives the same MTF50 for an edge of either contrast sign and either tilt sign', () => {
    const values = [5, 185, -5, 175].map((angle) => slantedEdgeMtf(slantedEdge(2, angle)).mtf50CyclesPerPixel);
    for (const value of values) expect(Math.abs(value / values[0] - 1)).toBeLessThan(0.002);
  });

  it('measures only inside rect', () => {
    const image = slantedEdge(1.5, 5);
    const result = slantedEdgeMtf(image, { rect: { x: 24, y: 10, width: 80, height: 100 } });
    expect(Math.abs(result.mtf50CyclesPerPixel / gaussianMtf50(1.5) - 1)).toBeLessThan(0.01);
  });

  it('throws a clear sentence when the region holds no edge', () => {
    expect(() => slantedEdgeMtf(addNoise(renderBlank(64, 64, 1000), 5, 1))).toThrow(
      'No usable edge in rect (x=0, y=0, width=64, height=64): it must hold one straight edge crossing it from side to side.',
    );
  });

  it('throws a clear sentence when the edge is square to the pixel grid', () => {
    const image = renderEdge({ width: 64, height: 64, normalAngleRad: 0, edgePointPx: { x: 32.3, y: 0 }, sigmaPx: 1, backgroundLevel: 500, targetLevel: 3500 });
    expect(() => slantedEdgeMtf(image)).toThrow(
      'The edge in rect (x=0, y=0, width=64, height=64) is tilted only 0.00° from the pixel grid; 4× oversampling needs a few degrees or more rows.',
    );
  });

  it('names a bad oversampling', () => {
    expect(() => slantedEdgeMtf(slantedEdge(1, 5), { oversampling: 3.5 })).toThrow(
      'oversampling must be a whole number from 2 to 8 (got 3.5).',
    );
  });
});

describe('squareEdgeRects', () => {
  for (const sigmaPx of [1.5, 2]) {
    it(`gives four regions, one per side of a 5°-tilted square, whose MTF50 is within 3 % of 0.1874/σ (σ = ${sigmaPx} px)`, () => {
      const image = renderSquare({
        width: 400, height: 400, centrePx: { x: 200.3, y: 199.6 }, sidePx: 220, angleRad: (5 * Math.PI) / 180, sigmaPx,
        backgroundLevel: 300, targetLevel: 3500, maxValue: 4095, supersampling: 1,
      });
      const square = measureSquare(image, { polarity: 'light-on-dark', approximateBoundingBox: { x: 80, y: 80, width: 240, height: 240 } });
      const rects = squareEdgeRects(square, { widthPx: 64 });
      expect(rects).toHaveLength(4);
      const orientations = rects.map((rect) => slantedEdgeMtf(image, { rect: clampRect(rect, 400, 400) }));
      expect(orientations.map((r) => r.edgeOrientation)).toEqual(['near-vertical', 'near-horizontal', 'near-vertical', 'near-horizontal']);
      for (const result of orientations) {
        expect(Math.abs(result.mtf50CyclesPerPixel / gaussianMtf50(sigmaPx) - 1)).toBeLessThan(0.03);
      }
    });
  }

  it('names a width larger than the square', () => {
    const image = renderSquare({ width: 200, height: 200, centrePx: { x: 100, y: 100 }, sidePx: 60, angleRad: 0.1, sigmaPx: 1, backgroundLevel: 300, targetLevel: 3500 });
    const square = measureSquare(image, { polarity: 'light-on-dark', approximateBoundingBox: { x: 60, y: 60, width: 80, height: 80 } });
    expect(() => squareEdgeRects(square, { widthPx: 100 })).toThrow(/^widthPx \(100\) must not exceed the square's side \(60\.\d px\)\.$/);
  });
});
