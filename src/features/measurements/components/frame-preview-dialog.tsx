import { useEffect, useRef } from 'react';
import type { Frame } from '@shared/schemas/frames';
import { formatFixed } from '@/components/charts/chart-format';
import { Button } from '@/components/ui/button';

export interface FramePreviewDialogProps {
  frames: readonly Frame[];
  index: number | null;
  onIndexChange: (index: number | null) => void;
  sweepLabel: string;
}

/** One uploaded frame at preview size (≤ 1600 px), stepping through the sweep with the buttons or Page Up / Page Down. */
export function FramePreviewDialog({ frames, index, onIndexChange, sweepLabel }: FramePreviewDialogProps) {
  const dialogRef = useRef<HTMLDialogElement>(null);
  const frame = index === null ? null : frames[index];

  useEffect(() => {
    const dialog = dialogRef.current;
    if (!dialog) return;
    if (frame && !dialog.open) dialog.showModal();
    if (!frame && dialog.open) dialog.close();
  }, [frame]);

  const step = (delta: number) => {
    if (index === null) return;
    const next = index + delta;
    if (next >= 0 && next < frames.length) onIndexChange(next);
  };

  return (
    <dialog
      ref={dialogRef}
      onClose={() => onIndexChange(null)}
      onKeyDown={(event) => {
        if (event.key === 'PageDown' || event.key === 'ArrowRight') step(1);
        if (event.key === 'PageUp' || event.key === 'ArrowLeft') step(-1);
      }}
      className="m-auto max-h-[92vh] w-[min(92vw,72rem)] rounded-sheet border border-rule-strong bg-sheet p-0 text-ink shadow-sheet backdrop:bg-ink/50"
      aria-label={frame ? `${frame.fileName}, ${sweepLabel}` : 'Frame preview'}
    >
      {frame ? (
        <div className="flex max-h-[92vh] flex-col">
          <div className="flex flex-wrap items-center gap-3 border-b border-rule px-4 py-2">
            <p className="font-mono text-small font-semibold">{frame.fileName}</p>
            <p className="text-small text-ink-faint">
              {sweepLabel} · frame {index! + 1} of {frames.length} · {frame.widthPx} × {frame.heightPx} px · {frame.bitDepth}-bit
              {frame.positionMm !== null ? <> · reading <span className="numerals text-ink">{formatFixed(frame.positionMm, 3)}</span> mm</> : null}
              {frame.excluded ? ' · excluded' : ''}
            </p>
            <div className="ml-auto flex gap-2">
              <Button variant="secondary" size="sm" onClick={() => step(-1)} disabled={index === 0}>
                ← Previous
              </Button>
              <Button variant="secondary" size="sm" onClick={() => step(1)} disabled={index === frames.length - 1}>
                Next →
              </Button>
              {frame.originalUrl ? (
                <a href={frame.originalUrl} download={frame.fileName} className="inline-flex h-8 items-center rounded-sheet border border-rule-strong px-3 text-small hover:bg-shade">
                  Original file
                </a>
              ) : null}
              <Button variant="primary" size="sm" onClick={() => onIndexChange(null)}>
                Close
              </Button>
            </div>
          </div>
          <div className="min-h-0 flex-1 overflow-auto bg-shade p-3">
            <img src={frame.previewUrl} alt={`${frame.fileName} at preview size`} className="mx-auto block max-h-[78vh] max-w-full object-contain" />
          </div>
        </div>
      ) : null}
    </dialog>
  );
}
