import type { PixelRect } from '../types';
import type { TargetDetection } from './detect-target';

export interface ScaleTargetDetectionOptions {
  /** The `factor` the reduced copy was made with (see `downsampleImage`). */
  factor: number;
}

function mapDetection(
  detection: TargetDetection,
  point: (p: { x: number; y: number }) => { x: number; y: number },
  rect: (r: PixelRect) => PixelRect,
  areaScale: number,
): TargetDetection {
  return {
    ...detection,
    boundingBox: rect(detection.boundingBox),
    blurExtentBox: rect(detection.blurExtentBox),
    centrePx: point(detection.centrePx),
    blobs: detection.blobs.map((blob) => ({
      ...blob,
      centroidPx: point(blob.centroidPx),
      areaPx: blob.areaPx * areaScale,
      boundingBox: rect(blob.boundingBox),
    })),
  };
}

/** A detection made on a reduced copy, in full-resolution pixel coordinates. */
export function scaleTargetDetection(detection: TargetDetection, { factor }: ScaleTargetDetectionOptions): TargetDetection {
  if (!Number.isInteger(factor) || factor < 1) {
    throw new RangeError(`factor must be a whole number of at least 1 (got ${factor}).`);
  }
  const offset = (factor - 1) / 2;
  return mapDetection(
    detection,
    (p) => ({ x: p.x * factor + offset, y: p.y * factor + offset }),
    (r) => ({ x: r.x * factor, y: r.y * factor, width: r.width * factor, height: r.height * factor }),
    factor * factor,
  );
}

/** A detection in the coordinates of a crop whose top-left pixel is `originPx` (same scale). */
export function shiftTargetDetection(detection: TargetDetection, { originPx }: { originPx: { x: number; y: number } }): TargetDetection {
  return mapDetection(
    detection,
    (p) => ({ x: p.x - originPx.x, y: p.y - originPx.y }),
    (r) => ({ ...r, x: r.x - originPx.x, y: r.y - originPx.y }),
    1,
  );
}
