import type { FocusOperator, GreyImage, PixelRect } from '../types';
import { checkRectInsideImage } from '../image/check-rect';
import { invariant } from '../image/invariant';

export const FOCUS_OPERATORS: readonly FocusOperator[] = [
  'gradient-energy',
  'laplacian-variance',
  'brenner',
  'normalised-variance',
];

export interface FocusMeasureOptions {
  operator: FocusOperator;
  /** Region to measure; the whole image when absent. At least 3×3 pixels. */
  rect?: PixelRect;
  /**
   * Default true: make the measure independent of exposure by dividing it by
   * the squared mean intensity of the region (normalised-variance, which is
   * already divided by the mean once, is divided by it once more).
   */
  normalise?: boolean;
  /** Subtracted from the (normalised, when normalise is on) result; see `estimateNoiseFloor`. */
  noiseFloor?: number;
}

export interface FocusMeasuresOptions {
  rect?: PixelRect;
  normalise?: boolean;
}

export interface FocusMeasureSet {
  measures: Record<FocusOperator, number>;
  /** Mean intensity of the whole region, the normalising level. */
  regionMeanIntensity: number;
  /** Pixels where the 3×3 kernels fit inside the region. */
  interiorPixelCount: number;
}

export function checkFocusMeasuresOptions(
  image: GreyImage,
  options: FocusMeasuresOptions = {},
): { rect: PixelRect; normalise: boolean } {
  const rect = checkRectInsideImage(image, options.rect, { minSizePx: 3 });
  const normalise = options.normalise ?? true;
  if (typeof normalise !== 'boolean') {
    throw new TypeError(`normalise must be true or false (got ${String(options.normalise)}).`);
  }
  return { rect, normalise };
}

export function checkFocusMeasureOptions(
  image: GreyImage,
  options: FocusMeasureOptions,
): { operator: FocusOperator; rect: PixelRect; normalise: boolean; noiseFloor: number } {
  if (!options || !FOCUS_OPERATORS.includes(options.operator)) {
    throw new RangeError(
      `operator must be one of ${FOCUS_OPERATORS.join(', ')} (got ${String(options?.operator)}).`,
    );
  }
  const { rect, normalise } = checkFocusMeasuresOptions(image, options);
  const noiseFloor = options.noiseFloor ?? 0;
  if (!Number.isFinite(noiseFloor) || noiseFloor < 0) {
    throw new RangeError(`noiseFloor must be a finite number of at least 0 (got ${options.noiseFloor}).`);
  }
  return { operator: options.operator, rect, normalise, noiseFloor };
}

/**
 * All four focus operators over one region, in one pass over the pixels.
 *
 * - gradient-energy (Tenengrad): mean of Gx² + Gy², 3×3 Sobel kernels.
 * - laplacian-variance: population variance of the 3×3 Laplacian
 *   [0 1 0; 1 −4 1; 0 1 0] (Pech-Pacheco et al., ICPR 2000).
 * - brenner: mean of (I(x+2) − I(x))² + (I(y+2) − I(y))², i.e. both directions,
 *   each pair centred on a pixel (so the stencil is the same 3×3 cross).
 * - normalised-variance: population variance of the intensities / their mean.
 *
 * The kernel operators are evaluated only where the 3×3 stencil fits inside the
 * region (its 1-pixel border is excluded); the variance uses every pixel.
 * Sums are in double precision, shifted by a pixel value so the one-pass
 * variance does not lose digits on bright images.
 */
export function focusMeasures(image: GreyImage, options: FocusMeasuresOptions = {}): FocusMeasureSet {
  const { rect, normalise } = checkFocusMeasuresOptions(image, options);
  const data = image.data;
  const stride = image.width;
  const x0 = rect.x;
  const y0 = rect.y;
  const w = rect.width;
  const h = rect.height;

  let sumIntensity = 0;
  let sumIntensitySq = 0;
  const shift = data[(y0 + (h >> 1)) * stride + x0 + (w >> 1)];
  for (let y = y0; y < y0 + h; y++) {
    const end = y * stride + x0 + w;
    for (let offset = y * stride + x0; offset < end; offset++) {
      const v = data[offset] - shift;
      sumIntensity += v;
      sumIntensitySq += v * v;
    }
  }

  let sumGradientSq = 0;
  let sumLaplacian = 0;
  let sumLaplacianSq = 0;
  let sumBrenner = 0;
  for (let y = y0 + 1; y < y0 + h - 1; y++) {
    const up = (y - 1) * stride + x0;
    const mid = y * stride + x0;
    const down = (y + 1) * stride + x0;
    let tl = data[up];
    let tc = data[up + 1];
    let ml = data[mid];
    let mc = data[mid + 1];
    let bl = data[down];
    let bc = data[down + 1];
    for (let x = 2; x < w; x++) {
      const tr = data[up + x];
      const mr = data[mid + x];
      const br = data[down + x];
      const gx = tr - tl + 2 * (mr - ml) + (br - bl);
      const gy = bl - tl + 2 * (bc - tc) + (br - tr);
      const laplacian = tc + bc + ml + mr - 4 * mc;
      const dx = mr - ml;
      const dy = bc - tc;
      sumGradientSq += gx * gx + gy * gy;
      sumLaplacian += laplacian;
      sumLaplacianSq += laplacian * laplacian;
      sumBrenner += dx * dx + dy * dy;
      tl = tc;
      tc = tr;
      ml = mc;
      mc = mr;
      bl = bc;
      bc = br;
    }
  }

  const pixelCount = w * h;
  const interiorPixelCount = (w - 2) * (h - 2);
  const meanShifted = sumIntensity / pixelCount;
  const regionMeanIntensity = meanShifted + shift;
  const intensityVariance = Math.max(sumIntensitySq / pixelCount - meanShifted * meanShifted, 0);
  const laplacianMean = sumLaplacian / interiorPixelCount;
  const laplacianVariance = Math.max(sumLaplacianSq / interiorPixelCount - laplacianMean * laplacianMean, 0);

  if (!(regionMeanIntensity > 0)) {
    throw new RangeError(
      `The region's mean intensity is ${regionMeanIntensity}; focus measures need a positive mean intensity (is the frame black?).`,
    );
  }
  const raw: Record<FocusOperator, number> = {
    'gradient-energy': sumGradientSq / interiorPixelCount,
    'laplacian-variance': laplacianVariance,
    brenner: sumBrenner / interiorPixelCount,
    'normalised-variance': intensityVariance / regionMeanIntensity,
  };
  const measures = raw;
  if (normalise) {
    const meanSq = regionMeanIntensity * regionMeanIntensity;
    for (const operator of FOCUS_OPERATORS) {
      measures[operator] = raw[operator] / (operator === 'normalised-variance' ? regionMeanIntensity : meanSq);
    }
  }
  for (const operator of FOCUS_OPERATORS) {
    invariant(Number.isFinite(measures[operator]), `focus measure ${operator} is not finite`);
  }
  return { measures, regionMeanIntensity, interiorPixelCount };
}

/** One focus operator over a region; see `focusMeasures` for the definitions. */
export function focusMeasure(image: GreyImage, options: FocusMeasureOptions): number {
  const { operator, rect, normalise, noiseFloor } = checkFocusMeasureOptions(image, options);
  return focusMeasures(image, { rect, normalise }).measures[operator] - noiseFloor;
}
