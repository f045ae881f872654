import type { GreyImage, PixelRect } from '../types';
import { boxReduce } from '../kernels/pixel-kernels';

export interface DownsampleImageOptions {
  /** Whole number of full-resolution pixels per reduced pixel along each axis. */
  factor: number;
}

export function checkDownsampleImageOptions(image: GreyImage, options: DownsampleImageOptions): Required<DownsampleImageOptions> {
  const { factor } = options;
  if (!Number.isInteger(factor) || factor < 1) {
    throw new RangeError(`factor must be a whole number of at least 1 (got ${factor}).`);
  }
  if (factor > image.width || factor > image.height) {
    throw new RangeError(`factor ${factor} is larger than the ${image.width}×${image.height} image.`);
  }
  return { factor };
}

/**
 * Box-average reduction: reduced pixel (i, j) is the mean of the full-resolution
 * block [i·factor, (i+1)·factor) × [j·factor, (j+1)·factor). Pixels past the last
 * whole block are dropped. With pixel centres at whole coordinates, reduced
 * coordinate u maps to full-resolution u·factor + (factor − 1)/2
 * (see `reducedToFullResolutionPx`).
 */
export function downsampleImage(image: GreyImage, options: DownsampleImageOptions): GreyImage {
  const { factor } = checkDownsampleImageOptions(image, options);
  const width = Math.floor(image.width / factor);
  const height = Math.floor(image.height / factor);
  // In the pixel kernel (WebAssembly): in JavaScript this reduction was a tenth of a frame's measuring time.
  return { width, height, data: boxReduce(image, factor, width, height), maxValue: image.maxValue };
}

/** Full-resolution coordinate of a reduced-copy coordinate (pixel centres at whole numbers). */
export function reducedToFullResolutionPx(coordinatePx: number, factor: number): number {
  return coordinatePx * factor + (factor - 1) / 2;
}

/** The full-resolution pixels covered by a rect of the reduced copy. */
export function reducedRectToFullResolution(rect: PixelRect, factor: number): PixelRect {
  return { x: rect.x * factor, y: rect.y * factor, width: rect.width * factor, height: rect.height * factor };
}
