import type { FocusOperator, GreyImage, PixelRect, TargetPattern, TargetPolarity } from '../types';
import type { FrameAnalysis, FrameOverlay } from '../../schemas/measurement-result';
import type { TargetDetection } from '../target/detect-target';
import { shiftTargetDetection } from '../target/target-detection-coordinates';
import { measureDotPair } from '../target/measure-dot-pair';
import { measureSquare } from '../target/measure-square';
import { focusMeasures } from '../focus/focus-measure';
import { chosenFocusMeasure } from '../focus/chosen-focus-measure';
import { SATURATION_LEVEL_SHARE } from '../image/saturated-fraction';
import { slantedEdgeMtf } from '../mtf/slanted-edge-mtf';
import { squareEdgeRects } from '../mtf/square-edge-rects';

export interface MeasureSweepFrameOptions {
  pattern: TargetPattern;
  polarity: TargetPolarity;
  focusOperator: FocusOperator;
  /** Also give every other operator's measure (`focusValues`); they cost a slower pass. */
  everyFocusOperator: boolean;
  /** Share of clipped pixels in the region above which a frame is rejected. */
  saturatedShareLimit: number;
}

/**
 * Pass 2 for one frame, on its full-resolution region `rect` (`region` holds
 * its pixels) with the target found at `detection` (full-frame pixels): the
 * clipped share, the focus measure, the target size and, for the square
 * target, the slanted-edge MTF50. `base` is the frame's rejected record,
 * filled in here.
 */
export function measureSweepFrame(
  region: GreyImage,
  rect: PixelRect,
  detection: TargetDetection,
  options: MeasureSweepFrameOptions,
  base: FrameAnalysis,
): FrameAnalysis {
  // One pass gives the focus measure, the mean level and the clipped share (the same level `saturatedFraction` uses).
  const focusOptions = { normalise: true, saturationLevel: SATURATION_LEVEL_SHARE * region.maxValue };
  let focusValue: number;
  let clipped: number;
  let meanLevel: number;
  let focusValues: FrameAnalysis['focusValues'];
  if (options.everyFocusOperator) {
    const set = focusMeasures(region, focusOptions);
    focusValue = set.measures[options.focusOperator];
    focusValues = set.measures;
    clipped = set.saturatedFraction as number;
    meanLevel = set.regionMeanIntensity;
  } else {
    const chosen = chosenFocusMeasure(region, { ...focusOptions, operator: options.focusOperator });
    focusValue = chosen.value;
    focusValues = { [options.focusOperator]: chosen.value };
    clipped = chosen.saturatedFraction as number;
    meanLevel = chosen.regionMeanIntensity;
  }
  const withLevels = { ...base, saturatedFraction: clipped, meanLevel };
  if (clipped > options.saturatedShareLimit) return { ...withLevels, reason: 'saturated' };
  const local = shiftTargetDetection(detection, { originPx: { x: rect.x, y: rect.y } });

  let sizePx: number | null = null;
  let overlay: FrameOverlay | null = null;
  let mtf50: number | null = null;
  try {
    if (options.pattern === 'dot-pair') {
      const [a, b] = local.blobs;
      const { dotRadius, searchRadiusPx } = dotWindowOf(local);
      const dots = measureDotPair(region, {
        polarity: options.polarity,
        approximateCentresPx: [a.centroidPx, b.centroidPx],
        searchRadiusPx,
      });
      sizePx = dots.sizePx;
      overlay = {
        pattern: 'dot-pair',
        regionPx: rect,
        pointsPx: dots.centresPx.map((p) => ({ x: p.x + rect.x, y: p.y + rect.y })),
        radiusPx: dotRadius,
      };
    } else {
      const square = measureSquare(region, { polarity: options.polarity, approximateBoundingBox: local.boundingBox });
      sizePx = square.sizePx;
      overlay = {
        pattern: 'square',
        regionPx: rect,
        pointsPx: square.cornersPx.map((p) => ({ x: p.x + rect.x, y: p.y + rect.y })),
      };
      mtf50 = medianOf(
        squareEdgeRects(square, { widthPx: Math.max(24, Math.round(square.sizePx * 0.25)) }).flatMap((edgeRect) => {
          try {
            const value = slantedEdgeMtf(region, { rect: edgeRect }).mtf50CyclesPerPixel;
            return Number.isFinite(value) ? [value] : [];
          } catch {
            return [];
          }
        }),
      );
    }
  } catch {
    return { ...withLevels, focusValue, focusValues, reason: 'target-lost' };
  }
  if (sizePx === null || !Number.isFinite(sizePx) || sizePx <= 0) {
    return { ...withLevels, focusValue, focusValues, reason: 'target-lost' };
  }
  return {
    ...withLevels,
    status: 'used',
    reason: undefined,
    focusValue,
    focusValues,
    sizePx,
    overlay,
    mtf50CyclesPerPixel: mtf50,
  };
}

/** The dot measurement's window sizes from a detection's two blobs: the dots' radius and the largest window radius it starts from. */
function dotWindowOf(detection: TargetDetection): { dotRadius: number; searchRadiusPx: number } {
  const [a, b] = detection.blobs;
  const separation = Math.hypot(a.centroidPx.x - b.centroidPx.x, a.centroidPx.y - b.centroidPx.y);
  const dotRadius = Math.sqrt(Math.max(a.areaPx, b.areaPx) / Math.PI);
  return { dotRadius, searchRadiusPx: Math.max(4, Math.min(0.48 * separation, 2.5 * dotRadius)) };
}

/**
 * How far from each dot's centre the dot measurement reads pixels for a
 * target detected like `detection`: the outer radius of the background ring
 * around its largest window (see measureDotPair), plus the ring sampling's
 * own pixel of margin.
 */
export function dotBackgroundReachPx(detection: TargetDetection): number {
  const [a, b] = detection.blobs;
  const separation = Math.hypot(a.centroidPx.x - b.centroidPx.x, a.centroidPx.y - b.centroidPx.y);
  const window = Math.min(dotWindowOf(detection).searchRadiusPx, 0.5 * separation);
  return window + 1 + Math.max(4, 0.5 * window) + 2;
}

function medianOf(values: number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}
