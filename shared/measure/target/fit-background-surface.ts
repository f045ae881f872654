import type { GreyImage } from '../types';
import { invariant } from '../image/invariant';
import { quantileInPlace } from '../statistics/select-in-place';
import { ReusableArray } from '../image/reusable-array';

// Scratch arrays of one fit (see ReusableArray); only the surface leaves fitBackgroundSurface.
const scratch = {
  uValues: new ReusableArray((n) => new Float64Array(n)),
  uPowers: new ReusableArray((n) => new Float64Array(n)),
  vPowers: new ReusableArray((n) => new Float64Array(n)),
  sampleIndex: new ReusableArray((n) => new Int32Array(n)),
  basis: new ReusableArray((n) => new Float64Array(n)),
  sampleValues: new ReusableArray((n) => new Float64Array(n)),
  inlier: new ReusableArray((n) => new Uint8Array(n)),
  residuals: new ReusableArray((n) => new Float64Array(n)),
  absoluteInlierResiduals: new ReusableArray((n) => new Float64Array(n)),
};

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

/** The polynomial's terms: exponents of x and y per term, and the powers of u(x) and v(y) up to the degree. */
interface SurfaceTerms {
  degree: number;
  /** Powers kept per coordinate: 0 … 2·degree. */
  powerCount: number;
  termCount: number;
  xExponents: Int32Array;
  yExponents: Int32Array;
  uPowers: Float64Array;
  vPowers: Float64Array;
}

// Each loop below is a function of its own that ends with nothing needing type
// feedback: code after a long loop that has never run deoptimises the loop's
// compiled (on-stack-replaced) form.

/** The regular sample grid's pixel indices and their rows of the design matrix (one column per term). */
function fillSampleBasis(terms: SurfaceTerms, width: number, height: number, stride: number, sampleIndex: Int32Array, basis: Float64Array): void {
  const { powerCount, termCount, xExponents, yExponents, uPowers, vPowers } = terms;
  for (let y = stride >> 1, s = 0; y < height; y += stride) {
    for (let x = stride >> 1; x < width; x += stride, s++) {
      sampleIndex[s] = y * width + x;
      for (let t = 0; t < termCount; t++) {
        basis[s * termCount + t] = uPowers[x * powerCount + xExponents[t]] * vPowers[y * powerCount + yExponents[t]];
      }
    }
  }
}

/**
 * Adds `scale` × the sums the normal equations need, over the samples whose
 * `inlier` flag equals `which`: the moments Σ uᵖvᵍ (p + q ≤ 2·degree, at
 * p·powerCount + q), from which every product of two terms is read, and
 * Σ value × term. Fewer sums than the products of term pairs themselves.
 */
function addMoments(
  terms: SurfaceTerms,
  sampleIndex: Int32Array,
  width: number,
  basis: Float64Array,
  sampleValues: Float64Array,
  inlier: Uint8Array,
  which: 0 | 1,
  scale: number,
  moments: Float64Array,
  rhs: Float64Array,
): void {
  const { powerCount, termCount, uPowers, vPowers } = terms;
  const highest = powerCount - 1;
  for (let s = 0; s < sampleValues.length; s++) {
    if (inlier[s] !== which) continue;
    const index = sampleIndex[s];
    const x = index % width;
    const uRow = x * powerCount;
    const vRow = ((index - x) / width) * powerCount;
    for (let p = 0; p <= highest; p++) {
      const scaledU = scale * uPowers[uRow + p];
      for (let q = 0; q <= highest - p; q++) moments[p * powerCount + q] += scaledU * vPowers[vRow + q];
    }
    const value = scale * sampleValues[s];
    const row = s * termCount;
    for (let t = 0; t < termCount; t++) rhs[t] += basis[row + t] * value;
  }
}

/** The normal matrix of the terms from the moments: entry (i, j) is Σ u^(aᵢ+aⱼ) v^(bᵢ+bⱼ). */
function normalMatrixFromMoments(terms: SurfaceTerms, moments: Float64Array): Float64Array {
  const { powerCount, termCount, xExponents, yExponents } = terms;
  const normal = new Float64Array(termCount * termCount);
  for (let i = 0; i < termCount; i++) {
    for (let j = 0; j < termCount; j++) {
      normal[i * termCount + j] = moments[(xExponents[i] + xExponents[j]) * powerCount + yExponents[i] + yExponents[j]];
    }
  }
  return normal;
}

/** Residuals of every sample from the fit; the inliers' absolute residuals go to the front of `absoluteInlierResiduals`. Returns their count. */
function fitResiduals(
  basis: Float64Array,
  sampleValues: Float64Array,
  termCount: number,
  coefficients: Float64Array,
  inlier: Uint8Array,
  residuals: Float64Array,
  absoluteInlierResiduals: Float64Array,
): number {
  let inlierResidualCount = 0;
  for (let s = 0; s < sampleValues.length; s++) {
    let fitted = 0;
    for (let t = 0; t < termCount; t++) fitted += coefficients[t] * basis[s * termCount + t];
    const residual = sampleValues[s] - fitted;
    residuals[s] = residual;
    if (inlier[s]) absoluteInlierResiduals[inlierResidualCount++] = Math.abs(residual);
  }
  return inlierResidualCount;
}

/** Flags the samples within ±limit as inliers; returns how many. */
function markInliers(residuals: Float64Array, limit: number, inlier: Uint8Array): number {
  let count = 0;
  for (let s = 0; s < residuals.length; s++) {
    const isInlier = Math.abs(residuals[s]) <= limit ? 1 : 0;
    inlier[s] = isInlier;
    count += isInlier;
  }
  return count;
}

/** The fitted surface at every pixel, row by row (Horner's rule in u along each row). */
function evaluateSurface(
  terms: SurfaceTerms,
  coefficients: Float64Array,
  uValues: Float64Array,
  width: number,
  height: number,
  surface: Float32Array,
): void {
  const { degree, powerCount, termCount, xExponents, yExponents, vPowers } = terms;
  const rowCoefficients = new Float64Array(degree + 1);
  for (let y = 0; y < height; y++) {
    rowCoefficients.fill(0);
    for (let t = 0; t < termCount; t++) {
      rowCoefficients[xExponents[t]] += coefficients[t] * vPowers[y * powerCount + yExponents[t]];
    }
    for (let x = 0; x < width; x++) {
      const u = uValues[x];
      let fitted = 0;
      for (let e = degree; e >= 0; e--) fitted = fitted * u + rowCoefficients[e];
      surface[y * width + x] = fitted;
    }
  }
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
  // Powers up to twice the degree: the normal equations are sums of products of two terms.
  const powerCount = 2 * degree + 1;
  const uValues = scratch.uValues.take(width);
  const uPowers = scratch.uPowers.take(width * powerCount);
  for (let x = 0; x < width; x++) {
    const u = (x - (width - 1) / 2) / halfWidth;
    uValues[x] = u;
    let p = 1;
    for (let e = 0; e < powerCount; e++, p *= u) uPowers[x * powerCount + e] = p;
  }
  const vPowers = scratch.vPowers.take(height * powerCount);
  for (let y = 0; y < height; y++) {
    const v = (y - (height - 1) / 2) / halfHeight;
    let p = 1;
    for (let e = 0; e < powerCount; e++, p *= v) vPowers[y * powerCount + e] = p;
  }

  const stride = Math.max(1, Math.ceil(Math.sqrt((width * height) / maxSamples)));
  const first = stride >> 1;
  const sampleCount = (first < width ? Math.ceil((width - first) / stride) : 0) * (first < height ? Math.ceil((height - first) / stride) : 0);
  invariant(sampleCount > 0, 'an image has at least one sample');
  const terms: SurfaceTerms = { degree, powerCount, termCount, xExponents, yExponents, uPowers, vPowers };
  const sampleIndex = scratch.sampleIndex.take(sampleCount);
  const basis = scratch.basis.take(sampleCount * termCount);
  fillSampleBasis(terms, width, height, stride, sampleIndex, basis);
  const sampleValues = scratch.sampleValues.take(sampleCount);
  for (let s = 0; s < sampleCount; s++) sampleValues[s] = data[sampleIndex[s]];

  const inlier = scratch.inlier.take(sampleCount).fill(1);
  const residuals = scratch.residuals.take(sampleCount);
  const absoluteInlierResiduals = scratch.absoluteInlierResiduals.take(sampleCount);
  let coefficients: Float64Array = new Float64Array(termCount);
  let residualStdDev = 0;
  let inlierCount = sampleCount;
  // The sums over all samples, once; each refit takes the few rejected samples back out.
  const momentsAll = new Float64Array(powerCount * powerCount);
  const rhsAll = new Float64Array(termCount);
  addMoments(terms, sampleIndex, width, basis, sampleValues, inlier, 1, 1, momentsAll, rhsAll);
  for (let iteration = 0; iteration < iterations; iteration++) {
    const moments = momentsAll.slice();
    const rhs = rhsAll.slice();
    if (inlierCount < sampleCount) addMoments(terms, sampleIndex, width, basis, sampleValues, inlier, 0, -1, moments, rhs);
    coefficients = solveLinearSystem(normalMatrixFromMoments(terms, moments), rhs, termCount);
    const inlierResidualCount = fitResiduals(basis, sampleValues, termCount, coefficients, inlier, residuals, absoluteInlierResiduals);
    residualStdDev = 1.4826 * quantileInPlace(absoluteInlierResiduals, 0.5, inlierResidualCount);
    const limit = rejectionSigma * Math.max(residualStdDev, 1e-12 * (Math.abs(coefficients[0]) + 1));
    inlierCount = markInliers(residuals, limit, inlier);
    if (inlierCount < termCount * 4) break;
  }

  const surface = new Float32Array(width * height);
  evaluateSurface(terms, coefficients, uValues, width, height, surface);
  return { surface, residualStdDev, inlierFraction: inlierCount / sampleCount };
}
