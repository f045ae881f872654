import type { GreyImage, TargetPattern, TargetPolarity } from '../types';
import type { TargetDetection } from './detect-target';
import { measureDotPair, type DotPairMeasurement } from './measure-dot-pair';
import { measureSquare, type SquareMeasurement } from './measure-square';

export interface MeasureTargetSizeOptions {
  pattern: TargetPattern;
  polarity: TargetPolarity;
  /** The target found on the reduced copy, already in this image's (crop) coordinates. */
  detection: TargetDetection;
}

/** What to draw over a thumbnail, in the measured image's pixel coordinates (JSON-safe). */
export type TargetOverlay =
  | { pattern: 'dot-pair'; dots: { centrePx: { x: number; y: number }; radiusPx: number }[] }
  | { pattern: 'square'; cornersPx: { x: number; y: number }[] };

export interface TargetSizeMeasurement {
  sizePx: number;
  overlay: TargetOverlay;
  dotPair?: DotPairMeasurement;
  square?: SquareMeasurement;
}

/** Measures the target's size in pixels by its pattern's method (see measureDotPair, measureSquare). */
export function measureTargetSize(image: GreyImage, options: MeasureTargetSizeOptions): TargetSizeMeasurement {
  const { pattern, polarity, detection } = options;
  if (!detection || !Array.isArray(detection.blobs)) {
    throw new RangeError('detection must be a target detection (from detectTarget) in the image’s coordinates.');
  }
  if (pattern === 'dot-pair') {
    if (detection.blobs.length !== 2) {
      throw new RangeError(`detection must hold two dots for a dot-pair target (it holds ${detection.blobs.length}).`);
    }
    const [a, b] = detection.blobs;
    const spacing = Math.hypot(a.centroidPx.x - b.centroidPx.x, a.centroidPx.y - b.centroidPx.y);
    const dotPair = measureDotPair(image, {
      polarity,
      approximateCentresPx: [a.centroidPx, b.centroidPx],
      searchRadiusPx: spacing / 2,
    });
    return {
      sizePx: dotPair.sizePx,
      overlay: {
        pattern,
        dots: dotPair.centresPx.map((centrePx, k) => ({ centrePx, radiusPx: Math.sqrt(detection.blobs[k].areaPx / Math.PI) })),
      },
      dotPair,
    };
  }
  if (pattern === 'square') {
    const square = measureSquare(image, { polarity, approximateBoundingBox: detection.boundingBox });
    return { sizePx: square.sizePx, overlay: { pattern, cornersPx: square.cornersPx }, square };
  }
  throw new RangeError(`pattern must be one of dot-pair, square (got ${String(pattern)}).`);
}
