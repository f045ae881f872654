import type { GreyImage, PixelRect } from '../types';

function describeRect(rect: PixelRect): string {
  return `(x=${rect.x}, y=${rect.y}, width=${rect.width}, height=${rect.height})`;
}

/**
 * Checks that `rect` is a whole-pixel rectangle inside `image`, at least
 * `minSizePx` on each side; returns the whole image when `rect` is absent.
 * Throws a sentence naming `optionName` otherwise.
 */
export function checkRectInsideImage(
  image: GreyImage,
  rect: PixelRect | undefined,
  { optionName = 'rect', minSizePx = 1 }: { optionName?: string; minSizePx?: number } = {},
): PixelRect {
  const region = rect ?? { x: 0, y: 0, width: image.width, height: image.height };
  const { x, y, width, height } = region;
  if (![x, y, width, height].every(Number.isInteger)) {
    throw new RangeError(`${optionName} ${describeRect(region)} must have whole-pixel x, y, width and height.`);
  }
  if (x < 0 || y < 0 || x + width > image.width || y + height > image.height) {
    throw new RangeError(
      `${optionName} ${describeRect(region)} must lie inside the ${image.width}×${image.height} image.`,
    );
  }
  if (width < minSizePx || height < minSizePx) {
    throw new RangeError(
      `${optionName} ${describeRect(region)} must be at least ${minSizePx}×${minSizePx} pixels.`,
    );
  }
  return region;
}
