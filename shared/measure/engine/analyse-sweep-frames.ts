import type { FocusOperator, TargetPattern, TargetPolarity } from '../types';
import type { FrameAnalysis } from '../../schemas/measurement-result';
import type { FrameSource } from './frame-source';
import type { RegionSize } from './choose-region-size';
import { analyseSweepFromLocatingSubset, RegionTooSmallForSweep } from './analyse-sweep-from-locating-subset';
import { analyseSweepLocatingEveryFrame } from './analyse-sweep-locating-every-frame';

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
  /** Also record every other focus operator's measure per frame (`focusValues`); default false, the chosen one only. */
  everyFocusOperator?: boolean;
  excludedFiles: Set<string>;
  /** Share of clipped pixels in the region above which a frame is rejected. */
  saturatedShareLimit: number;
  concurrency: number;
  onFrameDone: (file: string) => void;
}

export interface SweepFramesResult {
  frames: FrameAnalysis[];
  polarity: TargetPolarity;
  regionSize: RegionSize;
}

/**
 * Pass 1 (reduced copies): find the target and choose one region size for
 * the sweep, large enough for the widest blur. Pass 2 (full resolution): in
 * that region, per frame, the clipped share, the focus measure, target size
 * and (square target) slanted-edge MTF50. Frames are read ahead of the
 * computation on `concurrency` lanes, one more in pass 2 (decoding overlaps
 * the measuring), and never all held at once.
 *
 * Pass 1 first looks at three frames only (analyseSweepFromLocatingSubset);
 * when some frame's blur turns out wider than those three allow for, the
 * sweep is done again with every frame located first
 * (analyseSweepLocatingEveryFrame). Either way every region is at least as
 * large as the most blurred frame needs.
 */
export async function analyseSweepFrames(options: AnalyseSweepFramesOptions): Promise<SweepFramesResult> {
  const reported = new Set<string>();
  const onFrameDone = (file: string) => {
    // A frame measured before a restart is reported once.
    if (reported.has(file)) return;
    reported.add(file);
    options.onFrameDone(file);
  };
  try {
    return await analyseSweepFromLocatingSubset(options, onFrameDone);
  } catch (error) {
    if (!(error instanceof RegionTooSmallForSweep)) throw error;
    return analyseSweepLocatingEveryFrame(options, onFrameDone);
  }
}
