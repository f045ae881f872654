import { describe, expect, it } from 'vitest';
import { blurWithDefocusPsf, defocusPsfRadiusPx } from './blur-with-defocus-psf';

function impulseRegion(size: number, x: number, y: number): Float64Array {
  const values = new Float64Array(size * size);
  values[y * size + x] = 1;
  return values;
}

function moments(values: Float64Array, size: number) {
  let total = 0, sx = 0, sy = 0;
  for (let y = 0; y < size; y++) for (let x = 0; x < size; x++) {
    total += values[y * size + x];
    sx += values[y * size + x] * x;
    sy += values[y * size + x] * y;
  }
  const cx = sx / total, cy = sy / total;
  let vx = 0, vy = 0;
  for (let y = 0; y < size; y++) for (let x = 0; x < size; x++) {
    vx += values[y * size + x] * (x - cx) ** 2;
    vy += values[y * size + x] * (y - cy) ** 2;
  }
  return { total, cx, cy, varianceX: vx / total, varianceY: vy / total };
}

describe('blurWithDefocusPsf', () => {
  it('spreads an impulse into a Gaussian of variance σ₀² per axis, keeping its sum and centre', () => {
    const size = 64;
    const out = blurWithDefocusPsf({ values: impulseRegion(size, 30, 33), widthPx: size, heightPx: size, blurDiameterPx: 0, floorSigmaPx: 2 });
    const m = moments(out, size);
    expect(m.total).toBeCloseTo(1, 10);
    expect(m.cx).toBeCloseTo(30, 8);
    expect(m.cy).toBeCloseTo(33, 8);
    // Sampled Gaussian of σ = 2 px: variance σ² to well under 1 % (from memory: aliasing is negligible above σ ≈ 1 px).
    expect(m.varianceX).toBeCloseTo(4, 3);
    expect(m.varianceY).toBeCloseTo(4, 3);
  });

  it('spreads an impulse into a uniform disc: per-axis variance R²/4 (+ 1/12 px² for pixel integration) to 1 %', () => {
    const size = 128;
    const out = blurWithDefocusPsf({ values: impulseRegion(size, 64, 64), widthPx: size, heightPx: size, blurDiameterPx: 40, floorSigmaPx: 0 });
    const m = moments(out, size);
    // Uniform disc of radius R: ⟨x²⟩ = R²/4 (from memory).
    expect(Math.abs(m.varianceX / (100 + 1 / 12) - 1)).toBeLessThan(0.01);
    expect(out[64 * size + 64]).toBeCloseTo(1 / (Math.PI * 400), 5);
    expect(out[64 * size + 64 + 25]).toBeCloseTo(0, 8);
  });

  it('convolves linearly: nothing wraps round to the far side of the region', () => {
    const size = 60;
    const out = blurWithDefocusPsf({ values: impulseRegion(size, 1, 30), widthPx: size, heightPx: size, blurDiameterPx: 20, floorSigmaPx: 0.6 });
    let farSide = 0;
    for (let y = 0; y < size; y++) for (let x = size - 20; x < size; x++) farSide += Math.abs(out[y * size + x]);
    expect(farSide).toBeLessThan(1e-12);
    expect(defocusPsfRadiusPx(20, 0.6)).toBeGreaterThanOrEqual(10 + 2.4);
  });
});
