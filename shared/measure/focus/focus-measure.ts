import type { FocusOperator, GreyImage, PixelRect } from '../types';
import { checkRectInsideImage } from '../image/check-rect';
import { invariant } from '../image/invariant';
import { gradientEnergySums } from '../kernels/pixel-kernels';

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
  /**
   * Pixels at or above this level count as clipped, so one pass over the
   * region also gives its clipped share (see `saturatedFraction`); absent:
   * not counted.
   */
  saturationLevel?: number;
}

export interface FocusMeasureSet {
  measures: Record<FocusOperator, number>;
  /** Mean intensity of the whole region, the normalising level. */
  regionMeanIntensity: number;
  /** Share (0..1) of the region's pixels at or above `saturationLevel`; null when that option is absent. */
  saturatedFraction: number | null;
  /** Pixels where the 3×3 kernels fit inside the region. */
  interiorPixelCount: number;
}

export function checkFocusMeasuresOptions(
  image: GreyImage,
  options: FocusMeasuresOptions = {},
): { rect: PixelRect; normalise: boolean; saturationLevel: number | null } {
  const rect = checkRectInsideImage(image, options.rect, { minSizePx: 3 });
  const normalise = options.normalise ?? true;
  if (typeof normalise !== 'boolean') {
    throw new TypeError(`normalise must be true or false (got ${String(options.normalise)}).`);
  }
  const saturationLevel = options.saturationLevel ?? null;
  if (saturationLevel !== null && !Number.isFinite(saturationLevel)) {
    throw new RangeError(`saturationLevel must be a finite number (got ${options.saturationLevel}).`);
  }
  return { rect, normalise, saturationLevel };
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
  const { rect, normalise, saturationLevel } = checkFocusMeasuresOptions(image, options);
  const data = image.data;
  const stride = image.width;
  const x0 = rect.x;
  const y0 = rect.y;
  const w = rect.width;
  const h = rect.height;

  const shift = data[(y0 + (h >> 1)) * stride + x0 + (w >> 1)];
  // Gradient energy, the mean level and the clipped count from the pixel kernel, as `chosenFocusMeasure` takes them.
  const { sumIntensity, sumGradientSq, saturatedCount } = gradientEnergySums(image, rect, shift, saturationLevel ?? Infinity);
  const sums = new Float64Array(4);
  accumulateFocusSums(data, stride, x0, y0, w, h, shift, sums);
  const [sumIntensitySq, sumLaplacian, sumLaplacianSq, sumBrenner] = sums;

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
  const saturatedFraction = saturationLevel === null ? null : saturatedCount / pixelCount;
  return { measures, regionMeanIntensity, saturatedFraction, interiorPixelCount };
}

/** One focus operator over a region; see `focusMeasures` for the definitions. */
export function focusMeasure(image: GreyImage, options: FocusMeasureOptions): number {
  const { operator, rect, normalise, noiseFloor } = checkFocusMeasureOptions(image, options);
  return focusMeasures(image, { rect, normalise }).measures[operator] - noiseFloor;
}

/**
 * One pass over the region for the other sums the measures need, written to
 * `sums` as [Σ(I − shift)², ΣL, ΣL², Σ brenner] (gradient energy's come from
 * the pixel kernel). Along each row the three-pixel column sums b − t and
 * t + b are carried forward, so the Laplacian and Brenner stencils each cost
 * a few additions per pixel (for whole-number pixel values the sums are
 * exact, the same as summing each stencil in full).
 */
function accumulateFocusSums(
  data: Float32Array,
  stride: number,
  x0: number,
  y0: number,
  w: number,
  h: number,
  shift: number,
  sums: Float64Array,
): void {
  // Whole numbers as 32-bit integers: a rectangle's fields can arrive stored as doubles
  // (V8 widens a field's representation for every object of a shape), and index
  // arithmetic in doubles made this loop nearly twice as slow.
  stride |= 0;
  x0 |= 0;
  y0 |= 0;
  w |= 0;
  h |= 0;
  let sumIntensitySq = 0;
  let sumLaplacian = 0;
  let sumLaplacianSq = 0;
  let sumBrenner = 0;
  // The first and last rows and columns only count towards the intensity sums.
  for (let y = y0; y < y0 + h; y++) {
    const edgeRow = y === y0 || y === y0 + h - 1;
    const row = y * stride + x0;
    for (let x = 0; x < w; x += edgeRow ? 1 : w - 1) {
      const v = data[row + x] - shift;
      sumIntensitySq += v * v;
    }
  }
  for (let y = y0 + 1; y < y0 + h - 1; y++) {
    const up = (y - 1) * stride + x0;
    const mid = y * stride + x0;
    const down = (y + 1) * stride + x0;
    // Column sums at x − 1 (left) and x (centre), as the window moves right.
    let middleLeft = data[mid];
    let differenceCentre = data[down + 1] - data[up + 1];
    let outerCentre = data[up + 1] + data[down + 1];
    let middleCentre = data[mid + 1];
    for (let x = 2; x < w; x++) {
      const top = data[up + x];
      const middle = data[mid + x];
      const bottom = data[down + x];
      const differenceRight = bottom - top;
      const laplacian = outerCentre + middleLeft + middle - 4 * middleCentre;
      const dx = middle - middleLeft;
      sumLaplacian += laplacian;
      sumLaplacianSq += laplacian * laplacian;
      sumBrenner += dx * dx + differenceCentre * differenceCentre;
      const v = middleCentre - shift;
      sumIntensitySq += v * v;
      middleLeft = middleCentre;
      differenceCentre = differenceRight;
      outerCentre = top + bottom;
      middleCentre = middle;
    }
    // Stored row by row, not once after the loop: code after a long loop that has never run would deoptimise it.
    sums[0] = sumIntensitySq;
    sums[1] = sumLaplacian;
    sums[2] = sumLaplacianSq;
    sums[3] = sumBrenner;
  }
}
