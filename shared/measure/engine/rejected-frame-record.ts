import type { FrameAnalysis, FrameRejectionReason } from '../../schemas/measurement-result';

/** A frame's record before anything is measured: rejected, with `reason` when it is already known. */
export function rejectedFrameRecord(frame: { file: string; positionMm: number }, reason?: FrameRejectionReason): FrameAnalysis {
  const record: FrameAnalysis = {
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
  return reason ? { ...record, reason } : record;
}
