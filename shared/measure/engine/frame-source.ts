import type { GreyImage, PixelRect } from '../types';

/**
 * Where the engine gets pixels from. The server implements it with sharp on
 * files; tests may implement it in memory. Paths are as the manifest names them.
 */
export interface FrameSource {
  /**
   * A reduced copy of the whole frame (for finding the target), plus the
   * reduction factor (full-resolution px per reduced px) and full size.
   * Throws FrameMissingError or FrameUnreadableError.
   */
  readReduced(file: string): Promise<ReducedFrame>;
  /** A full-resolution crop of the frame. Throws FrameMissingError or FrameUnreadableError. */
  readRegion(file: string, rect: PixelRect): Promise<GreyImage>;
  /**
   * Optional: the engine has finished with an image this source returned and
   * keeps no reference to it, so the source may reuse its pixel array.
   */
  recycle?(image: GreyImage): void;
}

export interface ReducedFrame {
  image: GreyImage;
  factor: number;
  fullWidth: number;
  fullHeight: number;
}

export interface AnalysisProgress {
  phase: 'locating' | 'measuring' | 'fitting' | 'done';
  framesDone: number;
  framesTotal: number;
  file?: string;
}
