import type { FocusOperator, GreyImage, PixelRect, TargetPattern, TargetPolarity } from '../types';
import type { FrameAnalysis, FrameOverlay, FrameRejectionReason } from '../../schemas/measurement-result';
import { detectTarget, type TargetDetection } from '../target/detect-target';
import { scaleTargetDetection, shiftTargetDetection } from '../target/target-detection-coordinates';
import { measureDotPair } from '../target/measure-dot-pair';
import { measureSquare } from '../target/measure-square';
import { focusMeasures } from '../focus/focus-measure';
import { SATURATION_LEVEL_SHARE } from '../image/saturated-fraction';
import { slantedEdgeMtf } from '../mtf/slanted-edge-mtf';
import { squareEdgeRects } from '../mtf/square-edge-rects';
import { FrameMissingError, FrameUnreadableError, MeasurementError } from './measurement-error';
import type { FrameSource, ReducedFrame } from './frame-source';
import { mapWithReadAhead } from './map-with-read-ahead';

export interface SweepFrameInput {
  file: string;
  positionMm: number;
}

export interface AnalyseSweepFramesOptions {
  frames: SweepFrameInput[];
  source: FrameSource;
  pattern: TargetPattern;
  polarity?: TargetPolarity;
  focusOperator: FocusOperator;
  excludedFiles: Set<string>;
  /** Share of clipped pixels in the region above which a frame is rejected. */
  saturatedShareLimit: number;
  concurrency: number;
  onFrameDone: (file: string) => void;
}

export interface SweepFramesResult {
  frames: FrameAnalysis[];
  polarity: TargetPolarity;
  regionSidePx: number;
}

interface Located {
  detection: TargetDetection | null;
  reason?: FrameRejectionReason;
  detail?: string;
  factor: number;
  fullWidth: number;
  fullHeight: number;
}

/** Reads a frame through the source, turning decode failures into a rejection and a missing file into a user error. */
async function readOrReject<T>(file: string, read: () => Promise<T>): Promise<T | { rejected: string }> {
  try {
    return await read();
  } catch (error) {
    if (error instanceof FrameMissingError) {
      throw new MeasurementError('missing-file', `frame file not found: ${file}`);
    }
    if (error instanceof FrameUnreadableError) return { rejected: error.message };
    throw error;
  }
}

function isRejected<T>(value: T | { rejected: string }): value is { rejected: string } {
  return typeof value === 'object' && value !== null && 'rejected' in value;
}

/**
 * Pass 1 (reduced copies): find the target on every frame and choose one
 * region size for the sweep, large enough for the widest blur.
 * Pass 2 (full resolution): in that region, per frame, the clipped share,
 * focus measures, target size and (square target) slanted-edge MTF50.
 * Frames are read ahead of the computation on `concurrency` lanes (decoding
 * overlaps the measuring) and never all held at once.
 */
export async function analyseSweepFrames(options: AnalyseSweepFramesOptions): Promise<SweepFramesResult> {
  const { frames, source, pattern } = options;

  const located: Located[] = await mapWithReadAhead(
    frames,
    options.concurrency,
    async (frame) =>
      options.excludedFiles.has(frame.file) ? null : readOrReject<ReducedFrame>(frame.file, () => source.readReduced(frame.file)),
    (reduced): Located => {
      if (reduced === null) return { detection: null, reason: 'excluded', factor: 1, fullWidth: 0, fullHeight: 0 };
      if (isRejected(reduced)) {
        return { detection: null, reason: 'undecodable', detail: reduced.rejected, factor: 1, fullWidth: 0, fullHeight: 0 };
      }
      const detection = detectTarget(reduced.image, { pattern, polarity: options.polarity });
      source.recycle?.(reduced.image);
      const base = { factor: reduced.factor, fullWidth: reduced.fullWidth, fullHeight: reduced.fullHeight };
      if (!detection) return { ...base, detection: null, reason: 'target-lost' };
      return { ...base, detection: scaleTargetDetection(detection, { factor: reduced.factor }) };
    },
  );

  const found = located.filter((l) => l.detection !== null);
  if (found.length === 0) {
    const decodable = located.some((l) => l.reason === 'target-lost');
    throw new MeasurementError(
      decodable ? 'target-not-found' : 'too-few-frames',
      decodable
        ? `target not found: no frame of the sweep shows a ${pattern} target`
        : 'too few usable frames: no frame of the sweep could be decoded',
    );
  }
  const polarity = options.polarity ?? majorityPolarity(found.map((l) => l.detection!.polarity));
  const regionSidePx = chooseRegionSide(found.map((l) => l.detection!));

  const regionOf = (index: number): PixelRect | null => {
    const loc = located[index];
    if (!loc.detection || loc.detection.polarity !== polarity) return null;
    return regionAround(loc.detection.centrePx, regionSidePx, loc.fullWidth, loc.fullHeight);
  };
  const results: FrameAnalysis[] = await mapWithReadAhead(
    frames,
    options.concurrency,
    async (frame, index) => {
      const rect = regionOf(index);
      return rect ? readOrReject<GreyImage>(frame.file, () => source.readRegion(frame.file, rect)) : null;
    },
    (region, frame, index): FrameAnalysis => {
      const loc = located[index];
      const base: FrameAnalysis = {
        file: frame.file,
        positionMm: frame.positionMm,
        status: 'rejected',
        focusValue: null,
        sizePx: null,
        mtf50CyclesPerPixel: null,
        saturatedFraction: null,
        meanLevel: null,
        overlay: null,
        focusResidual: null,
      };
      try {
        const rect = regionOf(index);
        if (!loc.detection) return { ...base, reason: loc.reason ?? 'target-lost' };
        if (!rect || region === null) return { ...base, reason: 'target-lost' };
        if (isRejected(region)) return { ...base, reason: 'undecodable' };
        const measured = measureFrame(region, rect, loc.detection, { ...options, polarity }, base);
        source.recycle?.(region);
        return measured;
      } finally {
        options.onFrameDone(frame.file);
      }
    },
  );

  return { frames: results, polarity, regionSidePx };
}

function measureFrame(
  region: GreyImage,
  rect: PixelRect,
  detection: TargetDetection,
  options: AnalyseSweepFramesOptions & { polarity: TargetPolarity },
  base: FrameAnalysis,
): FrameAnalysis {
  // One pass gives the focus measures, the mean level and the clipped share (the same level `saturatedFraction` uses).
  const focus = focusMeasures(region, { normalise: true, saturationLevel: SATURATION_LEVEL_SHARE * region.maxValue });
  const clipped = focus.saturatedFraction as number;
  const withLevels = { ...base, saturatedFraction: clipped, meanLevel: focus.regionMeanIntensity };
  if (clipped > options.saturatedShareLimit) return { ...withLevels, reason: 'saturated' };
  const measures = focus.measures;
  const focusValue = measures[options.focusOperator];
  const local = shiftTargetDetection(detection, { originPx: { x: rect.x, y: rect.y } });

  let sizePx: number | null = null;
  let overlay: FrameOverlay | null = null;
  let mtf50: number | null = null;
  try {
    if (options.pattern === 'dot-pair') {
      const [a, b] = local.blobs;
      const separation = Math.hypot(a.centroidPx.x - b.centroidPx.x, a.centroidPx.y - b.centroidPx.y);
      const dotRadius = Math.sqrt(Math.max(a.areaPx, b.areaPx) / Math.PI);
      const searchRadiusPx = Math.max(4, Math.min(0.48 * separation, 2.5 * dotRadius));
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
    return { ...withLevels, focusValue, focusValues: measures, reason: 'target-lost' };
  }
  if (sizePx === null || !Number.isFinite(sizePx) || sizePx <= 0) {
    return { ...withLevels, focusValue, focusValues: measures, reason: 'target-lost' };
  }
  return {
    ...withLevels,
    status: 'used',
    reason: undefined,
    focusValue,
    focusValues: measures,
    sizePx,
    overlay,
    mtf50CyclesPerPixel: mtf50,
  };
}

function medianOf(values: number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

function majorityPolarity(values: TargetPolarity[]): TargetPolarity {
  const dark = values.filter((v) => v === 'dark-on-light').length;
  return dark * 2 >= values.length ? 'dark-on-light' : 'light-on-dark';
}

/**
 * One region side for the whole sweep: the largest blurred target extent
 * seen (down to 10 % contrast; the most blurred frame sets it) with a
 * margin of background around it, which both size methods need.
 */
function chooseRegionSide(detections: TargetDetection[]): number {
  const largest = Math.max(...detections.map((d) => Math.max(d.blurExtentBox.width, d.blurExtentBox.height)));
  return Math.ceil(largest * 1.3 + 16);
}

function regionAround(centre: { x: number; y: number }, side: number, width: number, height: number): PixelRect {
  const w = Math.min(side, width);
  const h = Math.min(side, height);
  const x = Math.round(Math.min(Math.max(0, centre.x - w / 2), width - w));
  const y = Math.round(Math.min(Math.max(0, centre.y - h / 2), height - h));
  return { x, y, width: w, height: h };
}
