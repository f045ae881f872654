import { describe, expect, it } from 'vitest';
import { fft1d, fft2d } from './fft';
import { createSeededRandom } from './seeded-random';

/** Direct O(n²) DFT, X_k = Σ x_n e^(−2πikn/N) (definition, from memory). */
function directDft(re: number[], im: number[]): { re: number[]; im: number[] } {
  const n = re.length;
  const outRe: number[] = [], outIm: number[] = [];
  for (let k = 0; k < n; k++) {
    let sr = 0, si = 0;
    for (let t = 0; t < n; t++) {
      const angle = (-2 * Math.PI * k * t) / n;
      sr += re[t] * Math.cos(angle) - im[t] * Math.sin(angle);
      si += re[t] * Math.sin(angle) + im[t] * Math.cos(angle);
    }
    outRe.push(sr);
    outIm.push(si);
  }
  return { re: outRe, im: outIm };
}

describe('fft1d', () => {
  it('equals the direct DFT of random complex data to 1e-10 for sizes 1 to 256', () => {
    const random = createSeededRandom(42);
    for (const n of [1, 2, 4, 8, 64, 256]) {
      const re = Array.from({ length: n }, () => random.normal());
      const im = Array.from({ length: n }, () => random.normal());
      const expected = directDft(re, im);
      const fr = Float64Array.from(re), fi = Float64Array.from(im);
      fft1d(fr, fi);
      for (let k = 0; k < n; k++) {
        expect(Math.abs(fr[k] - expected.re[k])).toBeLessThan(1e-10 * n);
        expect(Math.abs(fi[k] - expected.im[k])).toBeLessThan(1e-10 * n);
      }
    }
  });

  it('inverts itself (the inverse carries the 1/N)', () => {
    const random = createSeededRandom(7);
    const re = Float64Array.from({ length: 128 }, () => random.normal());
    const im = Float64Array.from({ length: 128 }, () => random.normal());
    const r = re.slice(), i = im.slice();
    fft1d(r, i);
    fft1d(r, i, true);
    for (let k = 0; k < 128; k++) {
      expect(r[k]).toBeCloseTo(re[k], 12);
      expect(i[k]).toBeCloseTo(im[k], 12);
    }
  });

  it('refuses a length that is not a power of two as an invariant', () => {
    expect(() => fft1d(new Float64Array(12), new Float64Array(12))).toThrow(/^invariant/);
  });
});

describe('fft2d', () => {
  it('turns a shifted impulse into the plane wave e^(−2πi(kx·x0/W + ky·y0/H)) (shift theorem)', () => {
    const w = 16, h = 8, x0 = 3, y0 = 5;
    const re = new Float64Array(w * h), im = new Float64Array(w * h);
    re[y0 * w + x0] = 1;
    fft2d(re, im, w, h);
    for (let ky = 0; ky < h; ky++) {
      for (let kx = 0; kx < w; kx++) {
        const angle = -2 * Math.PI * ((kx * x0) / w + (ky * y0) / h);
        expect(re[ky * w + kx]).toBeCloseTo(Math.cos(angle), 12);
        expect(im[ky * w + kx]).toBeCloseTo(Math.sin(angle), 12);
      }
    }
  });
});
