import type { GreyImage } from '../types';
import { invariant } from '../image/invariant';
import { quantileOfSorted } from './robust-statistics';

export interface FitBackgroundSurfaceOptions {
  /** Total degree of the polynomial in x and y; default 4 (enough for cos⁴ vignetting). */
  degree?: number;
  /** Pixels sampled on a regular grid for the fit; default 5 000. */
  maxSamples?: number;
  /** Refits after rejecting outliers; default 4. */
  iterations?: number;
  /** Residuals beyond this many robust standard deviations are left out of the next fit; default 3. */
  rejectionSigma?: number;
}

export interface BackgroundSurface {
  /** The fitted background at every pixel. */
  surface: Float32Array;
  /** Robust standard deviation of the inlier residuals. */
  residualStdDev: number;
  /** Share of the samples kept in the last fit. */
  inlierFraction: number;
}

export function checkFitBackgroundSurfaceOptions(options: FitBackgroundSurfaceOptions): Required<FitBackgroundSurfaceOptions> {
  const filled = { degree: 4, maxSamples: 5_000, iterations: 4, rejectionSigma: 3, ...options };
  if (!Number.isInteger(filled.degree) || filled.degree < 0 || filled.degree > 6) {
    throw new RangeError(`degree must be a whole number from 0 to 6 (got ${filled.degree}).`);
  }
  if (!Number.isInteger(filled.maxSamples) || filled.maxSamples < 100) {
    throw new RangeError(`maxSamples must be a whole number of at least 100 (got ${filled.maxSamples}).`);
  }
  if (!Number.isInteger(filled.iterations) || filled.iterations < 1) {
    throw new RangeError(`iterations must be a whole number of at least 1 (got ${filled.iterations}).`);
  }
  if (!(filled.rejectionSigma > 0)) {
    throw new RangeError(`rejectionSigma must be a positive number (got ${filled.rejectionSigma}).`);
  }
  return filled;
}

/** Solves the symmetric positive (semi-)definite system by Gaussian elimination with partial pivoting. */
function solveLinearSystem(matrix: Float64Array, rhs: Float64Array, size: number): Float64Array {
  const a = Float64Array.from(matrix);
  const b = Float64Array.from(rhs);
  for (let col = 0; col < size; col++) {
    let pivot = col;
    for (let row = col + 1; row < size; row++) {
      if (Math.abs(a[row * size + col]) > Math.abs(a[pivot * size + col])) pivot = row;
    }
    if (pivot !== col) {
      for (let k = 0; k < size; k++) {
        const t = a[col * size + k];
        a[col * size + k] = a[pivot * size + k];
        a[pivot * size + k] = t;
      }
      const t = b[col];
      b[col] = b[pivot];
      b[pivot] = t;
    }
    const diagonal = a[col * size + col];
    if (Math.abs(diagonal) < 1e-300) continue;
    for (let row = col + 1; row < size; row++) {
      const factor = a[row * size + col] / diagonal;
      if (factor === 0) continue;
      for (let k = col; k < size; k++) a[row * size + k] -= factor * a[col * size + k];
      b[row] -= factor * b[col];
    }
  }
  const x = new Float64Array(size);
  for (let row = size - 1; row >= 0; row--) {
    let sum = b[row];
    for (let k = row + 1; k < size; k++) sum -= a[row * size + k] * x[k];
    const diagonal = a[row * size + row];
    x[row] = Math.abs(diagonal) < 1e-300 ? 0 : sum / diagonal;
  }
  return x;
}

/**
 * A smooth background (shading, vignetting, lamp gradient) under a small
 * target: a least-squares polynomial surface in x and y, refitted with the
 * outliers (the target, dust) left out each time.
 */
export function fitBackgroundSurface(image: GreyImage, options: FitBackgroundSurfaceOptions = {}): BackgroundSurface {
  const { degree, maxSamples, iterations, rejectionSigma } = checkFitBackgroundSurfaceOptions(options);
  const { width, height, data } = image;
  const termCount = ((degree + 1) * (degree + 2)) / 2;
  const xExponents = new Int32Array(termCount);
  const yExponents = new Int32Array(termCount);
  for (let total = 0, t = 0; total <= degree; total++) {
    for (let j = 0; j <= total; j++, t++) {
      xExponents[t] = total - j;
      yExponents[t] = j;
    }
  }
  const halfWidth = Math.max((width - 1) / 2, 0.5);
  const halfHeight = Math.max((height - 1) / 2, 0.5);
  const uPowers = new Float64Array(width * (degree + 1));
  for (let x = 0; x < width; x++) {
    const u = (x - (width - 1) / 2) / halfWidth;
    let p = 1;
    for (let e = 0; e <= degree; e++, p *= u) uPowers[x * (degree + 1) + e] = p;
  }
  const vPowers = new Float64Array(height * (degree + 1));
  for (let y = 0; y < height; y++) {
    const v = (y - (height - 1) / 2) / halfHeight;
    let p = 1;
    for (let e = 0; e <= degree; e++, p *= v) vPowers[y * (degree + 1) + e] = p;
  }

  const stride = Math.max(1, Math.ceil(Math.sqrt((width * height) / maxSamples)));
  const sampleIndex: number[] = [];
  for (let y = stride >> 1; y < height; y += stride) {
    for (let x = stride >> 1; x < width; x += stride) sampleIndex.push(y * width + x);
  }
  const sampleCount = sampleIndex.length;
  invariant(sampleCount > 0, 'an image has at least one sample');
  const basis = new Float64Array(sampleCount * termCount);
  sampleIndex.forEach((index, s) => {
    const x = index % width;
    const y = (index - x) / width;
    for (let t = 0; t < termCount; t++) {
      basis[s * termCount + t] = uPowers[x * (degree + 1) + xExponents[t]] * vPowers[y * (degree + 1) + yExponents[t]];
    }
  });

  const inlier = new Uint8Array(sampleCount).fill(1);
  const residuals = new Float64Array(sampleCount);
  let coefficients: Float64Array = new Float64Array(termCount);
  let residualStdDev = 0;
  let inlierCount = sampleCount;
  for (let iteration = 0; iteration < iterations; iteration++) {
    const normal = new Float64Array(termCount * termCount);
    const rhs = new Float64Array(termCount);
    for (let s = 0; s < sampleCount; s++) {
      if (!inlier[s]) continue;
      const row = s * termCount;
      const value = data[sampleIndex[s]];
      for (let i = 0; i < termCount; i++) {
        const bi = basis[row + i];
        rhs[i] += bi * value;
        for (let j = i; j < termCount; j++) normal[i * termCount + j] += bi * basis[row + j];
      }
    }
    for (let i = 0; i < termCount; i++) for (let j = 0; j < i; j++) normal[i * termCount + j] = normal[j * termCount + i];
    coefficients = solveLinearSystem(normal, rhs, termCount);

    const inlierResiduals: number[] = [];
    for (let s = 0; s < sampleCount; s++) {
      let fitted = 0;
      for (let t = 0; t < termCount; t++) fitted += coefficients[t] * basis[s * termCount + t];
      residuals[s] = data[sampleIndex[s]] - fitted;
      if (inlier[s]) inlierResiduals.push(Math.abs(residuals[s]));
    }
    const sortedAbs = Float64Array.from(inlierResiduals).sort();
    residualStdDev = 1.4826 * quantileOfSorted(sortedAbs, 0.5);
    const limit = rejectionSigma * Math.max(residualStdDev, 1e-12 * (Math.abs(coefficients[0]) + 1));
    inlierCount = 0;
    for (let s = 0; s < sampleCount; s++) {
      inlier[s] = Math.abs(residuals[s]) <= limit ? 1 : 0;
      inlierCount += inlier[s];
    }
    if (inlierCount < termCount * 4) break;
  }

  const surface = new Float32Array(width * height);
  const rowCoefficients = new Float64Array(degree + 1);
  for (let y = 0; y < height; y++) {
    rowCoefficients.fill(0);
    for (let t = 0; t < termCount; t++) {
      rowCoefficients[xExponents[t]] += coefficients[t] * vPowers[y * (degree + 1) + yExponents[t]];
    }
    for (let x = 0; x < width; x++) {
      const u = (x - (width - 1) / 2) / halfWidth;
      let fitted = 0;
      for (let e = degree; e >= 0; e--) fitted = fitted * u + rowCoefficients[e];
      surface[y * width + x] = fitted;
    }
  }
  return { surface, residualStdDev, inlierFraction: inlierCount / sampleCount };
}
