import type { GreyImage, PixelRect } from '../types';
import type { FrameAnalysis, FrameRejectionReason } from '../../schemas/measurement-result';
import { detectTarget, type TargetDetection } from '../target/detect-target';
import { scaleTargetDetection } from '../target/target-detection-coordinates';
import { MeasurementError } from './measurement-error';
import type { ReducedFrame } from './frame-source';
import { mapWithReadAhead } from './map-with-read-ahead';
import { isUnreadable, readOrReject } from './read-or-reject';
import { chooseRegionSize } from './choose-region-size';
import { regionAround } from './region-around';
import { majorityPolarity } from './majority-polarity';
import { measureSweepFrame } from './measure-sweep-frame';
import { rejectedFrameRecord } from './rejected-frame-record';
import type { AnalyseSweepFramesOptions, SweepFramesResult } from './analyse-sweep-frames';

export interface LocatedFrame {
  detection: TargetDetection | null;
  reason?: FrameRejectionReason;
  factor: number;
  fullWidth: number;
  fullHeight: number;
}

/** Finds the target on one frame's reduced copy; the detection is in full-resolution pixels. */
export function locateOnReducedFrame(
  reduced: ReducedFrame | null | { rejected: string },
  options: Pick<AnalyseSweepFramesOptions, 'pattern' | 'polarity' | 'source'>,
): LocatedFrame {
  if (reduced === null) return { detection: null, reason: 'excluded', factor: 1, fullWidth: 0, fullHeight: 0 };
  if (isUnreadable(reduced)) return { detection: null, reason: 'undecodable', factor: 1, fullWidth: 0, fullHeight: 0 };
  const detection = detectTarget(reduced.image, { pattern: options.pattern, polarity: options.polarity });
  options.source.recycle?.(reduced.image);
  const base = { factor: reduced.factor, fullWidth: reduced.fullWidth, fullHeight: reduced.fullHeight };
  if (!detection) return { ...base, detection: null, reason: 'target-lost' };
  return { ...base, detection: scaleTargetDetection(detection, { factor: reduced.factor }) };
}

/** "Target not found" when some frame was decoded, "too few frames" when none could be. */
export function noTargetError(located: LocatedFrame[], pattern: string): MeasurementError {
  const decodable = located.some((l) => l.reason === 'target-lost');
  return new MeasurementError(
    decodable ? 'target-not-found' : 'too-few-frames',
    decodable
      ? `target not found: no frame of the sweep shows a ${pattern} target`
      : 'too few usable frames: no frame of the sweep could be decoded',
  );
}

/**
 * The sweep analysed with the target located on every frame's reduced copy
 * first (pass 1), then every frame's region measured at full resolution
 * (pass 2). The sure path, used when the locating subset cannot vouch for
 * the region size (see analyseSweepFrames).
 */
export async function analyseSweepLocatingEveryFrame(
  options: AnalyseSweepFramesOptions,
  onFrameDone: (file: string) => void,
): Promise<SweepFramesResult> {
  const { frames, source, pattern } = options;

  const located: LocatedFrame[] = await mapWithReadAhead(
    frames,
    options.concurrency,
    async (frame) =>
      options.excludedFiles.has(frame.file) ? null : readOrReject<ReducedFrame>(frame.file, () => source.readReduced(frame.file)),
    (reduced) => locateOnReducedFrame(reduced, options),
  );

  const found = located.filter((l) => l.detection !== null);
  if (found.length === 0) throw noTargetError(located, pattern);
  const polarity = options.polarity ?? majorityPolarity(found.map((l) => l.detection!.polarity));
  const regionSize = chooseRegionSize(found.map((l) => l.detection!));
  const measureOptions = { ...options, polarity, everyFocusOperator: options.everyFocusOperator ?? false };

  const regionOf = (index: number): PixelRect | null => {
    const loc = located[index];
    if (!loc.detection || loc.detection.polarity !== polarity) return null;
    return regionAround(loc.detection.centrePx, regionSize, loc.fullWidth, loc.fullHeight);
  };
  // One read more in flight than lanes: while this thread measures a frame, `concurrency` decodes still run.
  const results: FrameAnalysis[] = await mapWithReadAhead(
    frames,
    options.concurrency + 1,
    async (frame, index) => {
      const rect = regionOf(index);
      return rect ? readOrReject<GreyImage>(frame.file, () => source.readRegion(frame.file, rect)) : null;
    },
    (region, frame, index): FrameAnalysis => {
      const loc = located[index];
      const base = rejectedFrameRecord(frame);
      try {
        const rect = regionOf(index);
        if (!loc.detection) return { ...base, reason: loc.reason ?? 'target-lost' };
        if (!rect || region === null) return { ...base, reason: 'target-lost' };
        if (isUnreadable(region)) return { ...base, reason: 'undecodable' };
        const measured = measureSweepFrame(region, rect, loc.detection, measureOptions, base);
        source.recycle?.(region);
        return measured;
      } finally {
        onFrameDone(frame.file);
      }
    },
  );

  return { frames: results, polarity, regionSize };
}
