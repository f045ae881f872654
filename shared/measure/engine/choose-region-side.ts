import type { TargetDetection } from '../target/detect-target';

/**
 * One region side for the whole sweep: the largest blurred target extent
 * seen (down to 10 % contrast; the most blurred frame sets it) with a
 * margin of background around it, which both size methods need.
 * `slackPx` is added to that extent first (see analyseSweepFromLocatingSubset).
 */
export function chooseRegionSide(detections: TargetDetection[], slackPx = 0): number {
  const largest = Math.max(...detections.map((d) => Math.max(d.blurExtentBox.width, d.blurExtentBox.height)));
  return Math.ceil((largest + slackPx) * 1.3 + 16);
}
