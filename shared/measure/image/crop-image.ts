import type { GreyImage, PixelRect } from '../types';
import { checkRectInsideImage } from './check-rect';

/**
 * A copy of the pixels of `rect`. The rect must lie inside the image (use
 * `clampRect` first when it may not); coordinates in the crop are those of
 * the image minus (rect.x, rect.y).
 */
export function cropImage(image: GreyImage, rect: PixelRect): GreyImage {
  const { x, y, width, height } = checkRectInsideImage(image, rect);
  const data = new Float32Array(width * height);
  for (let row = 0; row < height; row++) {
    const start = (y + row) * image.width + x;
    data.set(image.data.subarray(start, start + width), row * width);
  }
  return { width, height, data, maxValue: image.maxValue };
}
