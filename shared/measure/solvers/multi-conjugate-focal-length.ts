/**
 * The focal length `solveMultiConjugate` gives, alone: the same whitened
 * least squares for [f, h, h′] and the same refinement of the magnification
 * term's weights, without option checks, covariance or residuals, in
 * preallocated arrays. For Monte Carlo draws of the multi-conjugate model
 * (10⁵ solves per analysis), where the general solver's allocations cost
 * about 80 µs a draw.
 */
export interface ConjugateColumns {
  /** Object distance from the lens mark, per conjugate (mm). */
  objectDistanceMm: Float64Array;
  /** Image distance from the lens mark, per conjugate (mm). */
  imageDistanceMm: Float64Array;
  /** |magnification|, per conjugate. */
  magnitude: Float64Array;
  objectDistanceUncertaintyMm: Float64Array;
  imageDistanceUncertaintyMm: Float64Array;
  magnificationUncertainty: Float64Array;
}

export interface MultiConjugateScratch {
  design: Float64Array;
  observations: Float64Array;
}

export function multiConjugateScratch(conjugateCount: number): MultiConjugateScratch {
  return { design: new Float64Array(2 * conjugateCount * 3), observations: new Float64Array(2 * conjugateCount) };
}

export function multiConjugateFocalLength(c: ConjugateColumns, scratch: MultiConjugateScratch): number {
  const n = c.magnitude.length;
  const { design, observations } = scratch;
  let focalLengthMm = NaN;
  for (let iteration = 0; iteration < 8; iteration++) {
    const f = Number.isFinite(focalLengthMm) ? focalLengthMm : 0;
    for (let i = 0; i < n; i++) {
      const m = c.magnitude[i];
      // As in solveMultiConjugate: rows [1 + 1/m, −1, 0] and [1 + m, 0, 1], whitened with the pair's 2 × 2 covariance.
      const sensitivityObject = (-f / (m * m)) * c.magnificationUncertainty[i];
      const sensitivityImage = f * c.magnificationUncertainty[i];
      const varianceObject = c.objectDistanceUncertaintyMm[i] ** 2 + sensitivityObject ** 2;
      const varianceImage = c.imageDistanceUncertaintyMm[i] ** 2 + sensitivityImage ** 2;
      const covarianceObjectImage = sensitivityObject * sensitivityImage;
      const fallbackVariance = Math.max(varianceObject, varianceImage, 1e-24);
      const l11 = Math.sqrt(varianceObject > 0 ? varianceObject : fallbackVariance);
      const l21 = covarianceObjectImage / l11;
      const l22 = Math.sqrt(Math.max((varianceImage > 0 ? varianceImage : fallbackVariance) - l21 * l21, 1e-30 * fallbackVariance));
      const o0 = (1 + 1 / m) / l11;
      const o1 = -1 / l11;
      const row = 6 * i;
      design[row] = o0;
      design[row + 1] = o1;
      design[row + 2] = 0;
      design[row + 3] = (1 + m - l21 * o0) / l22;
      design[row + 4] = (0 - l21 * o1) / l22;
      design[row + 5] = (1 - l21 * 0) / l22;
      const whitenedObject = c.objectDistanceMm[i] / l11;
      observations[2 * i] = whitenedObject;
      observations[2 * i + 1] = (c.imageDistanceMm[i] - l21 * whitenedObject) / l22;
    }
    const next = leastSquaresFirstParameter(design, observations, 2 * n);
    const settled = Number.isFinite(focalLengthMm) && Math.abs(next - focalLengthMm) <= 1e-13 * Math.abs(next);
    focalLengthMm = next;
    if (settled) break;
  }
  return focalLengthMm;
}

/**
 * The first of three least-squares parameters of design · x ≈ observations
 * (rows × 3, row-major), by Householder QR in place (both arrays are
 * overwritten).
 */
function leastSquaresFirstParameter(a: Float64Array, y: Float64Array, rows: number): number {
  for (let k = 0; k < 3; k++) {
    let norm = 0;
    for (let i = k; i < rows; i++) norm += a[3 * i + k] * a[3 * i + k];
    norm = Math.sqrt(norm);
    if (norm === 0) continue;
    const alpha = a[3 * k + k] > 0 ? -norm : norm;
    // v = column k below the diagonal with v₀ = a_kk − α; H = I − 2vvᵀ/(vᵀv), and vᵀv = 2(norm² − a_kk·α).
    const v0 = a[3 * k + k] - alpha;
    const vv = v0 * v0 + (norm * norm - a[3 * k + k] * a[3 * k + k]);
    if (vv === 0) continue;
    a[3 * k + k] = v0;
    for (let j = k + 1; j < 3; j++) {
      let s = 0;
      for (let i = k; i < rows; i++) s += a[3 * i + k] * a[3 * i + j];
      const scale = (2 * s) / vv;
      for (let i = k; i < rows; i++) a[3 * i + j] -= scale * a[3 * i + k];
    }
    let s = 0;
    for (let i = k; i < rows; i++) s += a[3 * i + k] * y[i];
    const scale = (2 * s) / vv;
    for (let i = k; i < rows; i++) y[i] -= scale * a[3 * i + k];
    a[3 * k + k] = alpha;
  }
  // Back substitution through the upper triangle R (diagonal α, entries above it as transformed).
  const x2 = y[2] / a[8];
  const x1 = (y[1] - a[5] * x2) / a[4];
  return (y[0] - a[1] * x1 - a[2] * x2) / a[0];
}
