import type { FocusOperator, GreyImage } from '../types';
import { invariant } from '../image/invariant';
import { checkFocusMeasuresOptions, FOCUS_OPERATORS, focusMeasures, type FocusMeasuresOptions } from './focus-measure';

export interface ChosenFocusMeasureOptions extends FocusMeasuresOptions {
  operator: FocusOperator;
}

export interface ChosenFocusMeasure {
  /** The chosen operator's measure, as `focusMeasures` gives it. */
  value: number;
  regionMeanIntensity: number;
  /** Share (0..1) of the region's pixels at or above `saturationLevel`; null when that option is absent. */
  saturatedFraction: number | null;
}

/**
 * One operator's focus measure with the region's mean level and clipped
 * share, equal to what `focusMeasures` gives for that operator. Gradient
 * energy, the engine's default, has a pass of its own that skips the other
 * stencils (about 40 % less work per frame); the other operators share the
 * all-operator pass.
 */
export function chosenFocusMeasure(image: GreyImage, options: ChosenFocusMeasureOptions): ChosenFocusMeasure {
  if (!options || !FOCUS_OPERATORS.includes(options.operator)) {
    throw new RangeError(`operator must be one of ${FOCUS_OPERATORS.join(', ')} (got ${String(options?.operator)}).`);
  }
  if (options.operator !== 'gradient-energy') {
    const set = focusMeasures(image, options);
    return { value: set.measures[options.operator], regionMeanIntensity: set.regionMeanIntensity, saturatedFraction: set.saturatedFraction };
  }
  const { rect, normalise, saturationLevel } = checkFocusMeasuresOptions(image, options);
  const data = image.data;
  const shift = data[(rect.y + (rect.height >> 1)) * image.width + rect.x + (rect.width >> 1)];
  const sums = new Float64Array(3);
  accumulateGradientSums(data, image.width, rect.x, rect.y, rect.width, rect.height, shift, saturationLevel ?? Infinity, sums);
  const [sumIntensity, sumGradientSq, saturatedCount] = sums;
  const pixelCount = rect.width * rect.height;
  const interiorPixelCount = (rect.width - 2) * (rect.height - 2);
  const regionMeanIntensity = sumIntensity / pixelCount + shift;
  if (!(regionMeanIntensity > 0)) {
    throw new RangeError(
      `The region's mean intensity is ${regionMeanIntensity}; focus measures need a positive mean intensity (is the frame black?).`,
    );
  }
  const raw = sumGradientSq / interiorPixelCount;
  const value = normalise ? raw / (regionMeanIntensity * regionMeanIntensity) : raw;
  invariant(Number.isFinite(value), 'focus measure gradient-energy is not finite');
  return { value, regionMeanIntensity, saturatedFraction: saturationLevel === null ? null : saturatedCount / pixelCount };
}

/**
 * The sums of `accumulateFocusSums` (focus-measure.ts) that gradient energy
 * needs, in the same order, so the results are the same to the last bit:
 * [Σ(I − shift), Σ(Gx² + Gy²), count of pixels ≥ saturationLevel].
 */
function accumulateGradientSums(
  data: Float32Array,
  stride: number,
  x0: number,
  y0: number,
  w: number,
  h: number,
  shift: number,
  saturationLevel: number,
  sums: Float64Array,
): void {
  // Whole numbers as 32-bit integers (see accumulateFocusSums).
  stride |= 0;
  x0 |= 0;
  y0 |= 0;
  w |= 0;
  h |= 0;
  let saturatedCount = 0;
  let sumIntensity = 0;
  let sumGradientSq = 0;
  for (let y = y0; y < y0 + h; y++) {
    const edgeRow = y === y0 || y === y0 + h - 1;
    const row = y * stride + x0;
    for (let x = 0; x < w; x += edgeRow ? 1 : w - 1) {
      if (data[row + x] >= saturationLevel) saturatedCount++;
      sumIntensity += data[row + x] - shift;
    }
  }
  for (let y = y0 + 1; y < y0 + h - 1; y++) {
    const up = (y - 1) * stride + x0;
    const mid = y * stride + x0;
    const down = (y + 1) * stride + x0;
    let smoothLeft = data[up] + 2 * data[mid] + data[down];
    let differenceLeft = data[down] - data[up];
    let smoothCentre = data[up + 1] + 2 * data[mid + 1] + data[down + 1];
    let differenceCentre = data[down + 1] - data[up + 1];
    let middleCentre = data[mid + 1];
    for (let x = 2; x < w; x++) {
      const top = data[up + x];
      const middle = data[mid + x];
      const bottom = data[down + x];
      const smoothRight = top + 2 * middle + bottom;
      const differenceRight = bottom - top;
      const gx = smoothRight - smoothLeft;
      const gy = differenceLeft + 2 * differenceCentre + differenceRight;
      sumGradientSq += gx * gx + gy * gy;
      if (middleCentre >= saturationLevel) saturatedCount++;
      sumIntensity += middleCentre - shift;
      smoothLeft = smoothCentre;
      differenceLeft = differenceCentre;
      smoothCentre = smoothRight;
      differenceCentre = differenceRight;
      middleCentre = middle;
    }
    // Stored row by row (see accumulateFocusSums).
    sums[0] = sumIntensity;
    sums[1] = sumGradientSq;
    sums[2] = saturatedCount;
  }
}
