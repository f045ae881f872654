import { fft2d, nextPowerOfTwo } from './fft';
import { rasteriseFeatureCoverage } from './target-coverage';

/** DFT of a normalised sampled Gaussian centred on 0 (wrapped); real because the kernel is even. */
function sampledGaussianSpectrum(size: number, sigmaPx: number): Float64Array {
  const spectrum = new Float64Array(size);
  if (sigmaPx === 0) return spectrum.fill(1);
  const reach = Math.ceil(4 * sigmaPx) + 1;
  const weights: number[] = [];
  for (let j = -reach; j <= reach; j++) weights.push(Math.exp(-(j * j) / (2 * sigmaPx * sigmaPx)));
  const total = weights.reduce((a, b) => a + b, 0);
  for (let k = 0; k < size; k++) {
    let sum = 0;
    for (let j = -reach; j <= reach; j++) sum += weights[j + reach] * Math.cos((2 * Math.PI * k * j) / size);
    spectrum[k] = sum / total;
  }
  return spectrum;
}

export interface DefocusBlurOptions {
  values: Float64Array;
  widthPx: number;
  heightPx: number;
  /** Geometric blur disc diameter c (uniform disc). */
  blurDiameterPx: number;
  /** Gaussian floor σ₀ convolved with the disc. */
  floorSigmaPx: number;
}

/** Pixels the PSF reaches from its centre; the caller pads its region by this much. */
export function defocusPsfRadiusPx(blurDiameterPx: number, floorSigmaPx: number): number {
  return Math.ceil(blurDiameterPx / 2 + 4 * Math.sqrt(floorSigmaPx * floorSigmaPx + 0.25) + 3);
}

/**
 * Linear (not circular) convolution of a region with the defocus PSF: a
 * uniform disc of diameter c (area-integrated over pixels) convolved with a
 * Gaussian σ₀, applied through a radix-2 FFT of a zero-padded copy. Values
 * outside the region are taken as zero and the result is cut back to the
 * region. The region and the disc kernel share one complex FFT (region in the
 * real part, kernel in the imaginary part, split by Hermitian symmetry). The
 * Gaussian is a sampled kernel truncated at ±(4σ + 1) px, applied through its
 * separable DFT; multiplying by the continuous transform exp(−2π²σ²ρ²)
 * instead would cut it off at the Nyquist frequency and ring across the
 * whole region.
 */
export function blurWithDefocusPsf(options: DefocusBlurOptions): Float64Array {
  const { values, widthPx, heightPx } = options;
  let sigmaSquared = options.floorSigmaPx * options.floorSigmaPx;
  let discRadiusPx = options.blurDiameterPx / 2;
  if (discRadiusPx < 1) {
    // Below a pixel the disc cannot be drawn on the grid; a Gaussian with the
    // same per-axis second moment (R²/4 for a uniform disc) stands in for it.
    sigmaSquared += (discRadiusPx * discRadiusPx) / 4;
    discRadiusPx = 0;
  }
  const reachPx = defocusPsfRadiusPx(2 * discRadiusPx, Math.sqrt(sigmaSquared));
  const nx = nextPowerOfTwo(widthPx + reachPx);
  const ny = nextPowerOfTwo(heightPx + reachPx);
  const re = new Float64Array(nx * ny);
  const im = new Float64Array(nx * ny);
  for (let y = 0; y < heightPx; y++) re.set(values.subarray(y * widthPx, (y + 1) * widthPx), y * nx);

  if (discRadiusPx === 0) {
    im[0] = 1;
  } else {
    const disc = rasteriseFeatureCoverage({ kind: 'disc', centreXPx: 0, centreYPx: 0, radiusPx: discRadiusPx }, 0);
    let total = 0;
    for (let k = 0; k < disc.values.length; k++) total += disc.values[k];
    for (let j = 0; j < disc.heightPx; j++) {
      const wy = (((disc.y0 + j) % ny) + ny) % ny;
      for (let i = 0; i < disc.widthPx; i++) {
        const w = disc.values[j * disc.widthPx + i];
        if (w === 0) continue;
        const wx = (((disc.x0 + i) % nx) + nx) % nx;
        im[wy * nx + wx] += w / total;
      }
    }
  }

  fft2d(re, im, nx, ny);
  const gaussianX = sampledGaussianSpectrum(nx, Math.sqrt(sigmaSquared));
  const gaussianY = sampledGaussianSpectrum(ny, Math.sqrt(sigmaSquared));
  const outRe = new Float64Array(nx * ny);
  const outIm = new Float64Array(nx * ny);
  for (let ky = 0; ky < ny; ky++) {
    const ry = (ny - ky) % ny;
    for (let kx = 0; kx < nx; kx++) {
      const rx = (nx - kx) % nx;
      const k = ky * nx + kx;
      const m = ry * nx + rx;
      const zr = re[k], zi = im[k], wr = re[m], wi = im[m];
      // Z = X + iH with X, H the spectra of two real arrays: X = (Z + conj Z₋)/2, H = (Z − conj Z₋)/2i.
      const xr = (zr + wr) / 2, xi = (zi - wi) / 2;
      const hr = (zi + wi) / 2, hi = -(zr - wr) / 2;
      const g = gaussianX[kx] * gaussianY[ky];
      outRe[k] = (xr * hr - xi * hi) * g;
      outIm[k] = (xr * hi + xi * hr) * g;
    }
  }
  fft2d(outRe, outIm, nx, ny, true);
  const result = new Float64Array(widthPx * heightPx);
  for (let y = 0; y < heightPx; y++) result.set(outRe.subarray(y * nx, y * nx + widthPx), y * widthPx);
  return result;
}
