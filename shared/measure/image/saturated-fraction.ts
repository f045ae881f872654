import type { GreyImage, PixelRect } from '../types';
import { checkRectInsideImage } from './check-rect';

/** Default clipping level, as a share of the image's full scale. */
export const SATURATION_LEVEL_SHARE = 0.98;

export interface SaturatedFractionOptions {
  rect?: PixelRect;
  /** Pixels at or above this value count as clipped; default 0.98 × maxValue. */
  threshold?: number;
}

export function checkSaturatedFractionOptions(
  image: GreyImage,
  options: SaturatedFractionOptions = {},
): { rect: PixelRect; threshold: number } {
  const rect = checkRectInsideImage(image, options.rect);
  const threshold = options.threshold ?? SATURATION_LEVEL_SHARE * image.maxValue;
  if (!Number.isFinite(threshold)) {
    throw new RangeError(`threshold must be a finite number (got ${options.threshold}).`);
  }
  return { rect, threshold };
}

/** Share (0..1) of the pixels of the region at or above the saturation threshold. */
export function saturatedFraction(image: GreyImage, options: SaturatedFractionOptions = {}): number {
  const { rect, threshold } = checkSaturatedFractionOptions(image, options);
  const data = image.data;
  let clipped = 0;
  for (let y = rect.y; y < rect.y + rect.height; y++) {
    const end = y * image.width + rect.x + rect.width;
    for (let offset = y * image.width + rect.x; offset < end; offset++) {
      if (data[offset] >= threshold) clipped++;
    }
  }
  return clipped / (rect.width * rect.height);
}
