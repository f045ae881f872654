import type { FocusOperator, GreyImage, PixelRect } from '../types';
import { checkRectInsideImage } from '../image/check-rect';
import { regionMean } from '../image/region-mean';
import { FOCUS_OPERATORS } from './focus-measure';

export interface EstimateNoiseFloorOptions {
  operator: FocusOperator;
  /** The region the focus measure is taken on (its mean sets the normalisation); whole image when absent. */
  rect?: PixelRect;
  /** A flat patch to estimate the pixel noise from; `rect` when absent (edges then inflate the estimate). */
  backgroundRect?: PixelRect;
  /** As in `focusMeasure`; default true. */
  normalise?: boolean;
}

export interface NoiseFloorEstimate {
  /** Expected contribution of the pixel noise to the measure, in the measure's own units. */
  noiseFloor: number;
  /** Estimated standard deviation of the pixel noise, in intensity units. */
  noiseStdDev: number;
}

/**
 * Expected value each operator gives for white noise of variance σ² alone:
 * the sum of the squared kernel weights (Sobel Gx and Gy: 12 each; Laplacian:
 * 1+1+1+1+16; Brenner's two centred differences: 2 each; the variance: 1).
 * Signal and noise are independent, so these add to the noise-free measure.
 */
const NOISE_GAIN: Record<FocusOperator, number> = {
  'gradient-energy': 24,
  'laplacian-variance': 20,
  brenner: 4,
  'normalised-variance': 1,
};

/** Pixel noise standard deviation by J. Immerkær, "Fast noise variance estimation",
 * CVIU 64 (1996) 300–302: mean absolute response to [1 −2 1; −2 4 −2; 1 −2 1],
 * a mask blind to any shading that is linear along x or y (vignetting, lamp gradients). */
export function estimatePixelNoiseStdDev(image: GreyImage, rect?: PixelRect): number {
  const region = checkRectInsideImage(image, rect, { optionName: 'backgroundRect', minSizePx: 3 });
  const data = image.data;
  const stride = image.width;
  let sumAbs = 0;
  for (let y = region.y + 1; y < region.y + region.height - 1; y++) {
    for (let x = region.x + 1; x < region.x + region.width - 1; x++) {
      const o = y * stride + x;
      const response =
        data[o - stride - 1] - 2 * data[o - stride] + data[o - stride + 1]
        - 2 * (data[o - 1] - 2 * data[o] + data[o + 1])
        + data[o + stride - 1] - 2 * data[o + stride] + data[o + stride + 1];
      sumAbs += Math.abs(response);
    }
  }
  const count = (region.width - 2) * (region.height - 2);
  return (Math.sqrt(Math.PI / 2) * sumAbs) / (6 * count);
}

/**
 * The noise floor of a focus measure, estimated from the image itself: the
 * pixel noise σ of a flat background patch (Immerkær's estimator), times the
 * operator's noise gain (see NOISE_GAIN), normalised like the measure. Pass
 * the result as `noiseFloor` to `focusMeasure`. With photon noise, σ depends on
 * the level, so pick a patch as bright as the region's background.
 */
export function estimateNoiseFloor(image: GreyImage, options: EstimateNoiseFloorOptions): NoiseFloorEstimate {
  if (!options || !FOCUS_OPERATORS.includes(options.operator)) {
    throw new RangeError(
      `operator must be one of ${FOCUS_OPERATORS.join(', ')} (got ${String(options?.operator)}).`,
    );
  }
  const rect = checkRectInsideImage(image, options.rect, { minSizePx: 3 });
  const normalise = options.normalise ?? true;
  const noiseStdDev = estimatePixelNoiseStdDev(image, options.backgroundRect ?? rect);
  const noiseVariance = noiseStdDev * noiseStdDev;
  const mean = regionMean(image, rect);
  if (mean <= 0) {
    throw new RangeError(`The region's mean intensity is ${mean}; the noise floor needs a positive mean intensity.`);
  }
  const divisor = normalise ? mean * mean : options.operator === 'normalised-variance' ? mean : 1;
  const noiseFloor = (NOISE_GAIN[options.operator] * noiseVariance) / divisor;
  return { noiseFloor, noiseStdDev };
}
