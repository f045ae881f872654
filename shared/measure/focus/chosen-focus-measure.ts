import type { FocusOperator, GreyImage } from '../types';
import { invariant } from '../image/invariant';
import { checkFocusMeasuresOptions, FOCUS_OPERATORS, focusMeasures, type FocusMeasuresOptions } from './focus-measure';
import { gradientEnergySums } from '../kernels/pixel-kernels';

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
 * share, equal to the last bit to what `focusMeasures` gives for that
 * operator. Gradient energy, the engine's default, needs only the pixel
 * kernel's sums (`gradientEnergySums`), which `focusMeasures` uses as well;
 * the other operators share the all-operator pass.
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
  const shift = image.data[(rect.y + (rect.height >> 1)) * image.width + rect.x + (rect.width >> 1)];
  const { sumIntensity, sumGradientSq, saturatedCount } = gradientEnergySums(image, rect, shift, saturationLevel ?? Infinity);
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
