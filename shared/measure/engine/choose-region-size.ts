import type { TargetDetection } from '../target/detect-target';
import { dotBackgroundReachPx } from './measure-sweep-frame';

export interface RegionSize {
  width: number;
  height: number;
}

/**
 * One region size for the whole sweep. Along each axis: the largest blurred
 * target extent seen (down to 10 % contrast; the most blurred frame sets
 * it) with a margin of background, and for a dot pair at least what the dot
 * measurement reads around both dots (its background rings); never more
 * than the square the larger extent needs. A pair lying along one axis thus
 * gets a band rather than a square: less to decode and to measure, the same
 * pixels for the dots. `slackPx` is added to the extents first (see
 * analyseSweepFromLocatingSubset).
 */
export function chooseRegionSize(detections: TargetDetection[], slackPx = 0): RegionSize {
  const withMargin = (extent: number) => Math.ceil((extent + slackPx) * 1.3 + 16);
  const square = withMargin(Math.max(...detections.map((d) => Math.max(d.blurExtentBox.width, d.blurExtentBox.height))));
  const along = (axis: 'x' | 'y') => {
    let need = withMargin(Math.max(...detections.map((d) => (axis === 'x' ? d.blurExtentBox.width : d.blurExtentBox.height))));
    for (const d of detections) {
      if (d.pattern !== 'dot-pair' || d.blobs.length !== 2) continue;
      const spread = Math.abs(d.blobs[0].centroidPx[axis] - d.blobs[1].centroidPx[axis]);
      need = Math.max(need, Math.ceil(spread + 2 * (dotBackgroundReachPx(d) + slackPx)));
    }
    return Math.min(square, need);
  };
  return { width: along('x'), height: along('y') };
}
