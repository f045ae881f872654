/**
 * A small iterative radix-2 Cooley–Tukey FFT (in place, complex, split
 * real/imaginary arrays) and its 2-D row-column form. Sizes must be powers
 * of two; the inverse includes the 1/N scaling.
 */

const twiddleCache = new Map<number, { cos: Float64Array; sin: Float64Array }>();

function twiddles(size: number): { cos: Float64Array; sin: Float64Array } {
  let table = twiddleCache.get(size);
  if (!table) {
    const half = size >> 1;
    table = { cos: new Float64Array(half), sin: new Float64Array(half) };
    for (let k = 0; k < half; k++) {
      table.cos[k] = Math.cos((2 * Math.PI * k) / size);
      table.sin[k] = Math.sin((2 * Math.PI * k) / size);
    }
    twiddleCache.set(size, table);
  }
  return table;
}

export function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n > 0 && (n & (n - 1)) === 0;
}

export function nextPowerOfTwo(n: number): number {
  let size = 1;
  while (size < n) size *= 2;
  return size;
}

/** In-place 1-D FFT of a complex array held as equal-length real and imaginary parts. */
export function fft1d(re: Float64Array, im: Float64Array, inverse = false): void {
  const size = re.length;
  if (!isPowerOfTwo(size) || im.length !== size) {
    throw new Error(`invariant: fft1d needs equal power-of-two lengths, got ${re.length} and ${im.length}`);
  }
  for (let i = 1, j = 0; i < size; i++) {
    let bit = size >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      let t = re[i]; re[i] = re[j]; re[j] = t;
      t = im[i]; im[i] = im[j]; im[j] = t;
    }
  }
  const { cos, sin } = twiddles(size);
  const sign = inverse ? 1 : -1;
  for (let length = 2; length <= size; length <<= 1) {
    const half = length >> 1;
    const tableStep = size / length;
    for (let k = 0, t = 0; k < half; k++, t += tableStep) {
      const wr = cos[t];
      const wi = sign * sin[t];
      for (let a = k; a < size; a += length) {
        const b = a + half;
        const br = re[b], bi = im[b];
        const xr = br * wr - bi * wi;
        const xi = br * wi + bi * wr;
        const ar = re[a], ai = im[a];
        re[b] = ar - xr;
        im[b] = ai - xi;
        re[a] = ar + xr;
        im[a] = ai + xi;
      }
    }
  }
  if (inverse) {
    for (let i = 0; i < size; i++) {
      re[i] /= size;
      im[i] /= size;
    }
  }
}

/** In-place 2-D FFT of a row-major `width` × `height` complex array (both powers of two). */
export function fft2d(re: Float64Array, im: Float64Array, width: number, height: number, inverse = false): void {
  if (re.length !== width * height || im.length !== width * height) {
    throw new Error(`invariant: fft2d arrays must hold ${width}×${height} values`);
  }
  const rowRe = new Float64Array(width);
  const rowIm = new Float64Array(width);
  for (let y = 0; y < height; y++) {
    const base = y * width;
    rowRe.set(re.subarray(base, base + width));
    rowIm.set(im.subarray(base, base + width));
    fft1d(rowRe, rowIm, inverse);
    re.set(rowRe, base);
    im.set(rowIm, base);
  }
  // Columns in blocks, so that gathering and scattering read whole cache lines.
  const block = Math.min(8, width);
  const colRe = Array.from({ length: block }, () => new Float64Array(height));
  const colIm = Array.from({ length: block }, () => new Float64Array(height));
  for (let x0 = 0; x0 < width; x0 += block) {
    for (let y = 0; y < height; y++) {
      const base = y * width + x0;
      for (let c = 0; c < block; c++) {
        colRe[c][y] = re[base + c];
        colIm[c][y] = im[base + c];
      }
    }
    for (let c = 0; c < block; c++) fft1d(colRe[c], colIm[c], inverse);
    for (let y = 0; y < height; y++) {
      const base = y * width + x0;
      for (let c = 0; c < block; c++) {
        re[base + c] = colRe[c][y];
        im[base + c] = colIm[c][y];
      }
    }
  }
}
