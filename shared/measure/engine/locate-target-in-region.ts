import type { GreyImage, PixelRect, TargetPattern, TargetPolarity } from '../types';
import { detectTarget, type TargetDetection } from '../target/detect-target';
import { downsampleImage } from '../image/downsample-image';
import { scaleTargetDetection, shiftTargetDetection } from '../target/target-detection-coordinates';

export interface LocateTargetInRegionOptions {
  pattern: TargetPattern;
  /** The sweep's polarity: a region sized to the target can be mostly target, so the minority rule cannot tell it. */
  polarity: TargetPolarity;
  /** Full-resolution pixels per reduced pixel, as for the frame's reduced copy, so detection sees the target at the same scale. */
  factor: number;
  /** Full frame size, to tell the region's own edges from the frame's. */
  frameWidth: number;
  frameHeight: number;
}

export interface TargetInRegion {
  /** In full-frame pixels. */
  detection: TargetDetection;
  /** The blurred target reaches a side of the region that is not the frame's edge, so it may spread beyond the region. */
  touchesRegionEdge: boolean;
}

/**
 * The target found in a full-resolution region of a frame (`region` holds
 * the pixels of `rect`), by the same detection as on a frame's reduced copy,
 * run on the region reduced by the same factor. Null when the region shows
 * no such target.
 */
export function locateTargetInRegion(region: GreyImage, rect: PixelRect, options: LocateTargetInRegionOptions): TargetInRegion | null {
  const factor = Math.min(options.factor, Math.floor(region.width / 8), Math.floor(region.height / 8));
  if (factor < 1) return null;
  const reduced = downsampleImage(region, { factor });
  // A region is sized to the blurred target plus a margin, so a sharp square fills up to (1/1.3)² ≈ 60 % of it.
  const found = detectTarget(reduced, { pattern: options.pattern, polarity: options.polarity, maxTargetFraction: 0.75 });
  if (!found) return null;
  const box = found.blurExtentBox;
  const touchesRegionEdge =
    (box.x <= 0 && rect.x > 0) ||
    (box.y <= 0 && rect.y > 0) ||
    (box.x + box.width >= reduced.width && rect.x + rect.width < options.frameWidth) ||
    (box.y + box.height >= reduced.height && rect.y + rect.height < options.frameHeight);
  const detection = shiftTargetDetection(scaleTargetDetection(found, { factor }), { originPx: { x: -rect.x, y: -rect.y } });
  return { detection, touchesRegionEdge };
}
