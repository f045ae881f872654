import { useEffect, useRef, useState } from 'react';
import type { FrameAnalysis, FrameRejectionReason, SweepResult } from '@shared/schemas/measurement-result';
import { formatFixed } from '@/components/charts/chart-format';
import { sweepPeaks } from '@/components/charts/sweep-plot-data';
import { FrameOverlayDrawing } from '@/features/measurement-result/components/frame-overlay-drawing';
import { FrameViewer } from '@/features/measurement-result/components/frame-viewer';

export interface FrameStripProps {
  sweep: SweepResult;
  sweepLabel: string;
  /** Full-frame size; overlays are in full-frame pixels. */
  frameWidthPx: number;
  frameHeightPx: number;
  /** Thumbnail size ÷ full-frame size, e.g. 0.1 for 160 × 120 thumbnails of 1600 × 1200 frames. */
  thumbnailScale: number;
  thumbnailUrl: (file: string) => string;
  frameUrl: (file: string) => string;
  /** The frame under the pointer or keyboard focus, shared with the plots. */
  highlightedFile?: string | null;
  onHighlightFile?: (file: string | null) => void;
}

export const SHORT_REASON_WORDS: Record<FrameRejectionReason, string> = {
  undecodable: 'undecodable',
  saturated: 'saturated',
  'target-lost': 'target lost',
  outlier: 'outlier',
  excluded: 'excluded',
};

/** For each best-focus position, the used frame nearest to it (the "sharpest" thumbnail to point at). */
export function bestFocusFrameFiles(frames: readonly FrameAnalysis[], bestFocusPositionsMm: readonly number[]): string[] {
  const used = frames.filter((f) => f.status === 'used');
  return bestFocusPositionsMm
    .map((positionMm) =>
      used.reduce<FrameAnalysis | null>(
        (nearest, f) => (nearest === null || Math.abs(f.positionMm - positionMm) < Math.abs(nearest.positionMm - positionMm) ? f : nearest),
        null,
      ),
    )
    .filter((f): f is FrameAnalysis => f !== null)
    .map((f) => f.file);
}

/**
 * A sweep's frames as a strip of thumbnails in rail order, the detected
 * target drawn over each; the frame nearest best focus is edged in the
 * signal colour, rejected frames are dimmed with their reason. A thumbnail
 * opens the full frame in the FrameViewer.
 */
export function FrameStrip({
  sweep,
  sweepLabel,
  frameWidthPx,
  frameHeightPx,
  thumbnailScale,
  thumbnailUrl,
  frameUrl,
  highlightedFile = null,
  onHighlightFile,
}: FrameStripProps) {
  const frames = [...(sweep.frames ?? [])].sort((a, b) => a.positionMm - b.positionMm);
  const peaks = sweepPeaks(sweep);
  const bestFiles = bestFocusFrameFiles(
    frames,
    peaks.map((p) => p.bestFocusPositionMm),
  );
  const rejections = new Map(sweep.framesRejected.map((r) => [r.file, r]));
  const [openIndex, setOpenIndex] = useState<number | null>(null);
  const listRef = useRef<HTMLOListElement>(null);
  const thumbWidthPx = Math.round(frameWidthPx * thumbnailScale);
  const thumbHeightPx = Math.round(frameHeightPx * thumbnailScale);

  useEffect(() => {
    const list = listRef.current;
    const first = list?.querySelector<HTMLElement>('[data-best-focus="true"]');
    if (!list || !first) return;
    list.scrollLeft = Math.max(0, first.offsetLeft - list.offsetLeft - (list.clientWidth - first.offsetWidth) / 2);
  }, [sweep]);

  return (
    <div className="rounded-sheet border border-rule bg-sheet p-3" data-role="frame-strip">
      <div className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-serif text-title-sm font-semibold">Frames, {sweepLabel}</h3>
        <p className="text-caption text-ink-faint">
          {sweep.framesUsed} used · {sweep.framesRejected.length} rejected · select a frame to inspect it at full size
        </p>
      </div>
      <ol ref={listRef} className="flex gap-2 overflow-x-auto pb-2" aria-label={`Frames of ${sweepLabel} in rail order`}>
        {frames.map((frame, index) => {
          const isBest = bestFiles.includes(frame.file);
          const peakSymbol = isBest ? peaks[bestFiles.indexOf(frame.file)]?.symbol : undefined;
          const isRejected = frame.status === 'rejected';
          const reason = frame.reason ?? rejections.get(frame.file)?.reason;
          const isHighlighted = highlightedFile === frame.file;
          const edge = isBest
            ? 'border-2 border-focus bg-focus-tint'
            : isHighlighted
              ? 'border-2 border-ink bg-shade'
              : 'border-2 border-transparent hover:border-rule-strong';
          const label = `Open frame ${frame.file} at ${frame.positionMm.toFixed(3)} mm${isBest ? `, nearest best focus ${peakSymbol}` : ''}${
            isRejected ? `, rejected: ${reason ? SHORT_REASON_WORDS[reason] : 'no reason recorded'}` : ''
          }`;
          return (
            <li key={frame.file} className="shrink-0" data-best-focus={isBest || undefined}>
              <button
                type="button"
                className={`block rounded-sheet p-1 text-left transition-colors ${edge}`}
                aria-label={label}
                title={isRejected && rejections.get(frame.file)?.detail ? rejections.get(frame.file)?.detail : undefined}
                data-file={frame.file}
                data-status={frame.status}
                onClick={() => setOpenIndex(index)}
                onMouseEnter={() => onHighlightFile?.(frame.file)}
                onMouseLeave={() => onHighlightFile?.(null)}
                onFocus={() => onHighlightFile?.(frame.file)}
                onBlur={() => onHighlightFile?.(null)}
              >
                <span className="relative block overflow-hidden rounded-hair bg-shade" style={{ width: thumbWidthPx, height: thumbHeightPx }}>
                  <Thumbnail src={thumbnailUrl(frame.file)} widthPx={thumbWidthPx} heightPx={thumbHeightPx} dimmed={isRejected} />
                  {frame.overlay ? (
                    <svg
                      className={`absolute inset-0 ${isRejected ? 'opacity-60' : ''}`}
                      width={thumbWidthPx}
                      height={thumbHeightPx}
                      viewBox={`0 0 ${thumbWidthPx} ${thumbHeightPx}`}
                      aria-hidden="true"
                      focusable="false"
                    >
                      <FrameOverlayDrawing overlay={frame.overlay} scale={thumbnailScale} strokeWidthPx={1} minimumMarkerRadiusPx={2.5} />
                    </svg>
                  ) : null}
                  {isRejected ? (
                    <span className="absolute inset-x-0 bottom-0 bg-sheet/90 px-1.5 py-px text-caption font-medium text-ink" data-role="rejection-reason">
                      Rejected · {reason ? SHORT_REASON_WORDS[reason] : 'no reason'}
                    </span>
                  ) : null}
                </span>
                <span className="mt-1 flex items-baseline justify-between gap-2 px-0.5">
                  <span className={`numerals text-small ${isRejected ? 'text-ink-faint' : 'text-ink'}`}>
                    {formatFixed(frame.positionMm, 3)}
                    <span className="ml-1 font-sans font-light text-ink-faint">mm</span>
                  </span>
                  {isBest ? (
                    <span className="text-caption font-semibold text-focus" data-role="best-focus-label">
                      best focus {peakSymbol}
                    </span>
                  ) : null}
                </span>
              </button>
            </li>
          );
        })}
      </ol>
      {openIndex !== null ? (
        <FrameViewer
          frames={frames}
          index={openIndex}
          onIndexChange={setOpenIndex}
          onClose={() => setOpenIndex(null)}
          sweep={sweep}
          sweepLabel={sweepLabel}
          frameUrl={frameUrl}
          frameWidthPx={frameWidthPx}
          frameHeightPx={frameHeightPx}
          bestFocusFiles={bestFiles}
        />
      ) : null}
    </div>
  );
}

/** A thumbnail that says so when it cannot be loaded (e.g. an undecodable frame has no preview). */
function Thumbnail({ src, widthPx, heightPx, dimmed }: { src: string; widthPx: number; heightPx: number; dimmed: boolean }) {
  const [failedSrc, setFailedSrc] = useState<string | null>(null);
  if (src === '' || failedSrc === src) {
    return (
      <span className="flex items-center justify-center text-caption text-ink-faint" style={{ width: widthPx, height: heightPx }}>
        no preview
      </span>
    );
  }
  return (
    <img
      src={src}
      alt=""
      width={widthPx}
      height={heightPx}
      loading="lazy"
      decoding="async"
      draggable={false}
      onError={() => setFailedSrc(src)}
      className={`block ${dimmed ? 'opacity-40 grayscale' : ''}`}
    />
  );
}
