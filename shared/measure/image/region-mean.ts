import type { GreyImage, PixelRect } from '../types';
import { checkRectInsideImage } from './check-rect';

/** Mean intensity of the region (whole image when `rect` is absent), summed in double precision. */
export function regionMean(image: GreyImage, rect?: PixelRect): number {
  const region = checkRectInsideImage(image, rect);
  const data = image.data;
  let sum = 0;
  for (let y = region.y; y < region.y + region.height; y++) {
    const end = y * image.width + region.x + region.width;
    for (let offset = y * image.width + region.x; offset < end; offset++) sum += data[offset];
  }
  return sum / (region.width * region.height);
}
