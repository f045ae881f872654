/**
 * Zoom and pan of a frame in the viewer: a screen point p shows the frame
 * pixel (p − offset) / scale.
 */
export interface FrameView {
  scale: number;
  offsetXPx: number;
  offsetYPx: number;
}

export interface FitFrameViewOptions {
  frameWidthPx: number;
  frameHeightPx: number;
  viewportWidthPx: number;
  viewportHeightPx: number;
}

export function checkFitFrameViewOptions(options: FitFrameViewOptions): FitFrameViewOptions {
  for (const key of ['frameWidthPx', 'frameHeightPx', 'viewportWidthPx', 'viewportHeightPx'] as const) {
    if (!(Number.isFinite(options[key]) && options[key] > 0)) {
      throw new RangeError(`fitFrameView: option "${key}" must be a positive number; got ${options[key]}.`);
    }
  }
  return options;
}

/** The whole frame, centred, as large as the viewport allows. */
export function fitFrameView(options: FitFrameViewOptions): FrameView {
  const { frameWidthPx, frameHeightPx, viewportWidthPx, viewportHeightPx } = checkFitFrameViewOptions(options);
  const scale = Math.min(viewportWidthPx / frameWidthPx, viewportHeightPx / frameHeightPx);
  return {
    scale,
    offsetXPx: (viewportWidthPx - frameWidthPx * scale) / 2,
    offsetYPx: (viewportHeightPx - frameHeightPx * scale) / 2,
  };
}

export interface ZoomFrameViewOptions {
  view: FrameView;
  /** > 1 zooms in. */
  factor: number;
  /** The screen point that stays put, e.g. the pointer or the viewport centre. */
  anchorXPx: number;
  anchorYPx: number;
  minScale: number;
  maxScale: number;
}

export function checkZoomFrameViewOptions(options: ZoomFrameViewOptions): ZoomFrameViewOptions {
  if (!(Number.isFinite(options.factor) && options.factor > 0)) {
    throw new RangeError(`zoomFrameViewAt: option "factor" must be a positive number; got ${options.factor}.`);
  }
  if (!(options.minScale > 0 && options.maxScale >= options.minScale)) {
    throw new RangeError(`zoomFrameViewAt: options "minScale" (${options.minScale}) and "maxScale" (${options.maxScale}) must satisfy 0 < min ≤ max.`);
  }
  return options;
}

/** Zooms about an anchor so the frame pixel under the anchor stays under it; the scale is clamped to [min, max]. */
export function zoomFrameViewAt(options: ZoomFrameViewOptions): FrameView {
  const { view, factor, anchorXPx, anchorYPx, minScale, maxScale } = checkZoomFrameViewOptions(options);
  const scale = Math.min(maxScale, Math.max(minScale, view.scale * factor));
  const ratio = scale / view.scale;
  return {
    scale,
    offsetXPx: anchorXPx - (anchorXPx - view.offsetXPx) * ratio,
    offsetYPx: anchorYPx - (anchorYPx - view.offsetYPx) * ratio,
  };
}

export function panFrameView(view: FrameView, deltaXPx: number, deltaYPx: number): FrameView {
  return { ...view, offsetXPx: view.offsetXPx + deltaXPx, offsetYPx: view.offsetYPx + deltaYPx };
}

/** The frame pixel shown at a screen point. */
export function framePixelAt(view: FrameView, screenXPx: number, screenYPx: number): { xPx: number; yPx: number } {
  return { xPx: (screenXPx - view.offsetXPx) / view.scale, yPx: (screenYPx - view.offsetYPx) / view.scale };
}
