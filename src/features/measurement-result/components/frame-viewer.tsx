import { useCallback, useEffect, useId, useRef, useState, type KeyboardEvent, type PointerEvent } from 'react';
import type { FrameAnalysis, SweepResult } from '@shared/schemas/measurement-result';
import { Button } from '@/components/ui/button';
import { formatFixed } from '@/components/charts/chart-format';
import { REJECTION_REASON_WORDS } from '@/components/charts/sweep-plot-data';
import { FrameOverlayDrawing } from '@/features/measurement-result/components/frame-overlay-drawing';
import {
  fitFrameView,
  framePixelAt,
  panFrameView,
  zoomFrameViewAt,
  type FrameView,
} from '@/features/measurement-result/components/frame-view-transform';

export interface FrameViewerProps {
  /** The sweep's frames in rail order; the viewer steps through them. */
  frames: readonly FrameAnalysis[];
  index: number;
  onIndexChange: (index: number) => void;
  onClose: () => void;
  sweep: SweepResult;
  sweepLabel: string;
  frameUrl: (file: string) => string;
  frameWidthPx: number;
  frameHeightPx: number;
  bestFocusFiles: readonly string[];
}

const ZOOM_STEP = 1.25;
const MAX_SCALE = 16;
const PAN_STEP_PX = 48;
const FALLBACK_VIEWPORT = { widthPx: 900, heightPx: 560 };

const FOCUSABLE = 'button:not([disabled]), [href], input, select, textarea, [tabindex]:not([tabindex="-1"])';

/**
 * One frame at full resolution in a modal dialog: zoom with the wheel, the
 * buttons or + and −, pan by dragging or with the arrow keys, step through
 * the sweep with Page Up / Page Down; Esc closes and focus stays inside
 * while it is open. The same zoom is kept from frame to frame, so a detail
 * can be compared through focus.
 */
export function FrameViewer({
  frames,
  index,
  onIndexChange,
  onClose,
  sweep,
  sweepLabel,
  frameUrl,
  frameWidthPx,
  frameHeightPx,
  bestFocusFiles,
}: FrameViewerProps) {
  const frame = frames[index];
  const dialogRef = useRef<HTMLDialogElement>(null);
  const viewportRef = useRef<HTMLDivElement>(null);
  const dragRef = useRef<{ pointerId: number; xPx: number; yPx: number } | null>(null);
  const measuredRef = useRef(false);
  const titleId = useId();
  const helpId = useId();
  const [viewport, setViewport] = useState(FALLBACK_VIEWPORT);
  const fit = useCallback(
    (size: { widthPx: number; heightPx: number }) =>
      fitFrameView({ frameWidthPx, frameHeightPx, viewportWidthPx: size.widthPx, viewportHeightPx: size.heightPx }),
    [frameWidthPx, frameHeightPx],
  );
  const [view, setView] = useState<FrameView>(() => fit(FALLBACK_VIEWPORT));
  const [pointerPixel, setPointerPixel] = useState<{ xPx: number; yPx: number } | null>(null);
  const minScale = fit(viewport).scale / 2;

  useEffect(() => {
    const dialog = dialogRef.current;
    const previouslyFocused = document.activeElement instanceof HTMLElement ? document.activeElement : null;
    if (dialog && !dialog.open && typeof dialog.showModal === 'function') dialog.showModal();
    viewportRef.current?.focus();
    return () => {
      if (dialog?.open) dialog.close();
      previouslyFocused?.focus();
    };
  }, []);

  useEffect(() => {
    const element = viewportRef.current;
    if (!element) return undefined;
    const measure = () => {
      const rect = element.getBoundingClientRect();
      if (rect.width > 0 && rect.height > 0) {
        const size = { widthPx: rect.width, heightPx: rect.height };
        setViewport(size);
        // The first real measure replaces the fallback fit; later resizes keep the user's zoom.
        if (!measuredRef.current) {
          measuredRef.current = true;
          setView(fit(size));
        }
      }
    };
    measure();
    const observer = typeof ResizeObserver === 'undefined' ? null : new ResizeObserver(measure);
    observer?.observe(element);
    return () => observer?.disconnect();
  }, [fit]);

  const zoomBy = useCallback(
    (factor: number, anchor?: { xPx: number; yPx: number }) => {
      setView((current) =>
        zoomFrameViewAt({
          view: current,
          factor,
          anchorXPx: anchor?.xPx ?? viewport.widthPx / 2,
          anchorYPx: anchor?.yPx ?? viewport.heightPx / 2,
          minScale,
          maxScale: MAX_SCALE,
        }),
      );
    },
    [viewport, minScale],
  );

  // React registers wheel listeners as passive, so preventDefault (to stop the page scrolling) needs a native one.
  useEffect(() => {
    const element = viewportRef.current;
    if (!element) return undefined;
    const onWheel = (event: WheelEvent) => {
      event.preventDefault();
      const rect = element.getBoundingClientRect();
      zoomBy(Math.exp(-event.deltaY * 0.0015), { xPx: event.clientX - rect.left, yPx: event.clientY - rect.top });
    };
    element.addEventListener('wheel', onWheel, { passive: false });
    return () => element.removeEventListener('wheel', onWheel);
  }, [zoomBy]);

  const step = (delta: number) => {
    const next = index + delta;
    if (next >= 0 && next < frames.length) onIndexChange(next);
  };

  const onDialogKeyDown = (event: KeyboardEvent<HTMLDialogElement>) => {
    if (event.key === 'Tab') {
      const focusable = Array.from(dialogRef.current?.querySelectorAll<HTMLElement>(FOCUSABLE) ?? []);
      if (focusable.length === 0) return;
      const first = focusable[0];
      const last = focusable[focusable.length - 1];
      if (event.shiftKey && document.activeElement === first) {
        event.preventDefault();
        last.focus();
      } else if (!event.shiftKey && document.activeElement === last) {
        event.preventDefault();
        first.focus();
      }
      return;
    }
    if (event.key === 'PageDown') {
      event.preventDefault();
      step(1);
    } else if (event.key === 'PageUp') {
      event.preventDefault();
      step(-1);
    }
  };

  const onViewportKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    const pans: Record<string, [number, number]> = {
      ArrowLeft: [PAN_STEP_PX, 0],
      ArrowRight: [-PAN_STEP_PX, 0],
      ArrowUp: [0, PAN_STEP_PX],
      ArrowDown: [0, -PAN_STEP_PX],
    };
    if (event.key in pans) {
      event.preventDefault();
      const [dx, dy] = pans[event.key];
      setView((current) => panFrameView(current, dx, dy));
    } else if (event.key === '+' || event.key === '=') {
      event.preventDefault();
      zoomBy(ZOOM_STEP);
    } else if (event.key === '-' || event.key === '_') {
      event.preventDefault();
      zoomBy(1 / ZOOM_STEP);
    } else if (event.key === '0') {
      event.preventDefault();
      setView(fit(viewport));
    }
  };

  const localPoint = (event: PointerEvent<HTMLDivElement>) => {
    const rect = event.currentTarget.getBoundingClientRect();
    return { xPx: event.clientX - rect.left, yPx: event.clientY - rect.top };
  };

  const onPointerDown = (event: PointerEvent<HTMLDivElement>) => {
    if (event.button !== 0) return;
    event.currentTarget.setPointerCapture(event.pointerId);
    const point = localPoint(event);
    dragRef.current = { pointerId: event.pointerId, ...point };
  };
  const onPointerMove = (event: PointerEvent<HTMLDivElement>) => {
    const point = localPoint(event);
    setPointerPixel(framePixelAt(view, point.xPx, point.yPx));
    const drag = dragRef.current;
    if (drag && drag.pointerId === event.pointerId) {
      setView((current) => panFrameView(current, point.xPx - drag.xPx, point.yPx - drag.yPx));
      dragRef.current = { ...drag, ...point };
    }
  };
  const endDrag = (event: PointerEvent<HTMLDivElement>) => {
    if (dragRef.current?.pointerId === event.pointerId) dragRef.current = null;
  };

  if (!frame) return null;
  const rejection = sweep.framesRejected.find((r) => r.file === frame.file);
  const reason = frame.reason ?? rejection?.reason;
  const isBest = bestFocusFiles.includes(frame.file);
  const insideFrame =
    pointerPixel !== null && pointerPixel.xPx >= 0 && pointerPixel.yPx >= 0 && pointerPixel.xPx <= frameWidthPx && pointerPixel.yPx <= frameHeightPx;

  return (
    <dialog
      ref={dialogRef}
      aria-labelledby={titleId}
      aria-modal="true"
      onCancel={(event) => {
        event.preventDefault();
        onClose();
      }}
      onKeyDown={onDialogKeyDown}
      className="m-auto flex h-[min(92vh,54rem)] w-[min(96vw,84rem)] max-w-none flex-col overflow-hidden rounded-sheet border border-rule-strong bg-sheet p-0 text-ink shadow-sheet backdrop:bg-ink/55"
      data-role="frame-viewer"
    >
      <header className="flex flex-wrap items-center gap-3 border-b border-rule px-4 py-2.5">
        <h2 id={titleId} className="font-serif text-title-sm">
          <span className="font-mono text-body">{frame.file}</span>
          <span className="font-sans text-small font-normal text-ink-faint">
            {' '}
            · {sweepLabel} · frame {index + 1} of {frames.length}
          </span>
        </h2>
        {isBest ? <span className="rounded-hair bg-focus-tint px-1.5 text-caption font-semibold text-focus">nearest best focus</span> : null}
        <div className="ml-auto flex items-center gap-1.5">
          <Button variant="secondary" size="sm" onClick={() => step(-1)} disabled={index === 0} aria-label="Previous frame (Page Up)">
            ← Previous
          </Button>
          <Button variant="secondary" size="sm" onClick={() => step(1)} disabled={index === frames.length - 1} aria-label="Next frame (Page Down)">
            Next →
          </Button>
          <span className="mx-1 h-6 w-px bg-rule" aria-hidden="true" />
          <Button variant="secondary" size="sm" onClick={() => zoomBy(1 / ZOOM_STEP)} aria-label="Zoom out (−)">
            −
          </Button>
          <span className="numerals w-14 text-center text-small text-ink-soft" aria-live="polite" data-role="zoom-level">
            {Math.round(view.scale * 100)} %
          </span>
          <Button variant="secondary" size="sm" onClick={() => zoomBy(ZOOM_STEP)} aria-label="Zoom in (+)">
            +
          </Button>
          <Button variant="secondary" size="sm" onClick={() => setView(fit(viewport))} aria-label="Fit the whole frame (0)">
            Fit
          </Button>
          <span className="mx-1 h-6 w-px bg-rule" aria-hidden="true" />
          <Button variant="primary" size="sm" onClick={onClose} aria-label="Close the frame viewer (Esc)">
            Close
          </Button>
        </div>
      </header>

      <div className="grid min-h-0 flex-1 grid-cols-1 md:grid-cols-[minmax(0,1fr)_17rem]">
        <div
          ref={viewportRef}
          tabIndex={0}
          role="group"
          aria-roledescription="zoomable image"
          aria-label={`Frame ${frame.file} at ${frame.positionMm.toFixed(3)} mm`}
          aria-describedby={helpId}
          className="relative min-h-64 cursor-grab touch-none overflow-hidden bg-shade active:cursor-grabbing"
          onKeyDown={onViewportKeyDown}
          onPointerDown={onPointerDown}
          onPointerMove={onPointerMove}
          onPointerUp={endDrag}
          onPointerCancel={endDrag}
          onPointerLeave={() => setPointerPixel(null)}
          data-role="frame-viewport"
        >
          <div
            className="absolute left-0 top-0 origin-top-left"
            style={{
              width: frameWidthPx,
              height: frameHeightPx,
              transform: `translate(${view.offsetXPx}px, ${view.offsetYPx}px) scale(${view.scale})`,
            }}
          >
            <img
              src={frameUrl(frame.file) || undefined}
              alt=""
              width={frameWidthPx}
              height={frameHeightPx}
              draggable={false}
              className="block max-w-none select-none"
              style={{ imageRendering: view.scale >= 3 ? 'pixelated' : 'auto' }}
            />
            {frame.overlay ? (
              <svg className="absolute inset-0" width={frameWidthPx} height={frameHeightPx} viewBox={`0 0 ${frameWidthPx} ${frameHeightPx}`} aria-hidden="true" focusable="false">
                <FrameOverlayDrawing overlay={frame.overlay} scale={1} strokeWidthPx={1.4} minimumMarkerRadiusPx={6 / view.scale} nonScalingStroke />
              </svg>
            ) : null}
          </div>
          <p id={helpId} className="pointer-events-none absolute bottom-2 left-2 rounded-hair bg-sheet/90 px-2 py-0.5 text-caption text-ink-soft">
            Wheel or + − to zoom · drag or arrow keys to pan · 0 fits · Page Up/Down steps frames · Esc closes
          </p>
          <p className="pointer-events-none absolute right-2 top-2 rounded-hair bg-sheet/90 px-2 py-0.5 text-caption text-ink-soft" data-role="pointer-position">
            {insideFrame && pointerPixel ? (
              <span className="numerals">
                x {formatFixed(pointerPixel.xPx, 1)}, y {formatFixed(pointerPixel.yPx, 1)} <span className="font-sans font-light text-ink-faint">px</span>
              </span>
            ) : (
              <span>
                {frameWidthPx} × {frameHeightPx} <span className="font-light text-ink-faint">px</span>
              </span>
            )}
          </p>
        </div>

        <aside className="overflow-y-auto border-t border-rule px-4 py-3 md:border-l md:border-t-0" aria-label="Frame readings">
          <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1.5 text-small">
            <Reading term="Rail position" value={formatFixed(frame.positionMm, 3)} unit="mm" />
            <dt className="text-ink-soft">Status</dt>
            <dd className="text-right">
              {frame.status === 'used' ? 'used' : `rejected: ${reason ? REJECTION_REASON_WORDS[reason] : 'no reason recorded'}`}
              {rejection?.detail ? <span className="block text-caption text-ink-faint">{rejection.detail}</span> : null}
            </dd>
            <Reading term="Focus measure" value={frame.focusValue === null ? '—' : formatFixed(frame.focusValue, 4)} unit="rel." />
            <Reading term="Residual" value={frame.focusResidual === null ? '—' : formatFixed(frame.focusResidual, 4)} unit="rel." />
            <Reading term="Target size" value={frame.sizePx === null ? '—' : formatFixed(frame.sizePx, 2)} unit="px" />
            <Reading term="MTF50" value={frame.mtf50CyclesPerPixel === null ? '—' : formatFixed(frame.mtf50CyclesPerPixel, 3)} unit="cy/px" />
            <Reading term="Saturated" value={frame.saturatedFraction === null ? '—' : formatFixed(frame.saturatedFraction * 100, 2)} unit="%" />
          </dl>
          {frame.overlay ? (
            <div className="mt-4">
              <h3 className="text-caption font-semibold uppercase tracking-wider text-ink-faint">
                {frame.overlay.pattern === 'dot-pair' ? 'Dot centres' : 'Square corners'}
              </h3>
              <ol className="mt-1 space-y-0.5 text-small">
                {frame.overlay.pointsPx.map((point, i) => (
                  <li key={i} className="numerals flex justify-between text-ink">
                    <span className="text-ink-faint">{i + 1}</span>
                    <span>
                      {formatFixed(point.x, 1)}, {formatFixed(point.y, 1)} <span className="font-sans font-light text-ink-faint">px</span>
                    </span>
                  </li>
                ))}
              </ol>
              <p className="mt-2 text-caption text-ink-faint">
                Region analysed: {frame.overlay.regionPx.width} × {frame.overlay.regionPx.height} px at ({frame.overlay.regionPx.x}, {frame.overlay.regionPx.y}).
              </p>
            </div>
          ) : (
            <p className="mt-4 text-small text-ink-faint">No target was located on this frame.</p>
          )}
        </aside>
      </div>
    </dialog>
  );
}

function Reading({ term, value, unit }: { term: string; value: string; unit: string }) {
  return (
    <>
      <dt className="text-ink-soft">{term}</dt>
      <dd className="text-right">
        <span className="numerals text-ink">{value}</span>
        {value !== '—' ? <span className="ml-1 font-light text-ink-faint">{unit}</span> : null}
      </dd>
    </>
  );
}
