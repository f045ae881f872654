/**
 * The analysis names each frame by its sweep folder and file name
 * ("s2/frame_0007.png", see server/services/engine-manifest.ts); the page
 * needs the stored frame behind that name for its thumbnail and preview.
 */
import type { Frame } from '@shared/schemas/frames';
import type { SweepDetail } from '@shared/schemas/measurements';

export function manifestFileOf(sweepIndex: number, fileName: string): string {
  return `s${sweepIndex + 1}/${fileName}`;
}

export function framesByManifestFile(sweeps: readonly SweepDetail[]): Map<string, Frame> {
  const byFile = new Map<string, Frame>();
  [...sweeps]
    .sort((a, b) => a.position - b.position)
    .forEach((sweep, index) => {
      for (const frame of sweep.frames) byFile.set(manifestFileOf(index, frame.fileName), frame);
    });
  return byFile;
}

export interface FrameGeometry {
  frameWidthPx: number;
  frameHeightPx: number;
  /** Thumbnail size ÷ frame size (thumbnails are at most `thumbnailMaxSidePx` on their long side, never enlarged). */
  thumbnailScale: number;
}

export function frameGeometry(sweeps: readonly SweepDetail[], thumbnailMaxSidePx: number): FrameGeometry | null {
  const first = sweeps.flatMap((sweep) => sweep.frames)[0];
  if (!first) return null;
  const longSide = Math.max(first.widthPx, first.heightPx);
  return { frameWidthPx: first.widthPx, frameHeightPx: first.heightPx, thumbnailScale: Math.min(1, thumbnailMaxSidePx / longSide) };
}
