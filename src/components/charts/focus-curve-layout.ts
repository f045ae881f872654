import { scaleLinear, type ScaleLinear } from 'd3-scale';
import type { FrameAnalysis, SweepResult } from '@shared/schemas/measurement-result';
import { plotArea, type PlotArea } from '@/components/charts/plot-area';
import {
  interpolateCurve,
  positionToPx,
  sweepPeaks,
  sweepPositionAxis,
  type PositionSegment,
  type SweepPeak,
} from '@/components/charts/sweep-plot-data';

export interface FocusCurveLayoutOptions {
  sweep: SweepResult;
  widthPx: number;
  /** Coverage factor k for the best-focus band (± k·u). */
  coverageFactor: number;
}

export interface FocusCurvePeakDrawing extends SweepPeak {
  expandedUncertaintyMm: number;
  xPx: number;
  bandLeftPx: number;
  bandRightPx: number;
  /** The fitted model at best focus, when the curve covers it. */
  peakValue: number | null;
}

/** One stretch of the rail: the curve area above, the residual strip below, both on its x scale. */
export interface FocusCurvePanel {
  segment: PositionSegment;
  mainArea: PlotArea;
  residualArea: PlotArea;
}

export interface FocusCurveLayout {
  widthPx: number;
  heightPx: number;
  /** The whole drawing area (all panels) of the curve and of the residuals. */
  mainArea: PlotArea;
  residualArea: PlotArea;
  panels: FocusCurvePanel[];
  xPx: (positionMm: number) => number;
  yScale: ScaleLinear<number, number>;
  residualScale: ScaleLinear<number, number>;
  peaks: FocusCurvePeakDrawing[];
  /** Frames with a focus value, in position order. */
  plottedFrames: FrameAnalysis[];
  /** Frames rejected before a focus value existed (e.g. undecodable): listed, not drawn. */
  unplottedFrames: FrameAnalysis[];
}

const MARGINS = { top: 34, right: 20, left: 68 };
const MAIN_HEIGHT_PX = 230;
const GAP_PX = 14;
const RESIDUAL_HEIGHT_PX = 78;
const BOTTOM_PX = 46;

export function checkFocusCurveLayoutOptions(options: FocusCurveLayoutOptions): FocusCurveLayoutOptions {
  if (!options.sweep) throw new TypeError('focusCurveLayout: option "sweep" is required.');
  if (!(Number.isFinite(options.coverageFactor) && options.coverageFactor > 0)) {
    throw new RangeError(`focusCurveLayout: option "coverageFactor" must be a positive number; got ${options.coverageFactor}.`);
  }
  if (!(Number.isFinite(options.widthPx) && options.widthPx >= 200)) {
    throw new RangeError(`focusCurveLayout: option "widthPx" must be at least 200; got ${options.widthPx}.`);
  }
  return options;
}

function areaBetween(whole: PlotArea, leftPx: number, rightPx: number): PlotArea {
  return { ...whole, leftPx, rightPx, innerWidthPx: rightPx - leftPx };
}

/**
 * Scales and areas of the focus-curve plot: the curve on top and, below it on
 * the same x scale, the residuals strip.
 */
export function focusCurveLayout(options: FocusCurveLayoutOptions): FocusCurveLayout {
  const { sweep, widthPx, coverageFactor } = checkFocusCurveLayoutOptions(options);
  const heightPx = MARGINS.top + MAIN_HEIGHT_PX + GAP_PX + RESIDUAL_HEIGHT_PX + BOTTOM_PX;
  const mainArea = plotArea({
    widthPx,
    heightPx,
    marginsPx: { top: MARGINS.top, right: MARGINS.right, left: MARGINS.left, bottom: heightPx - MARGINS.top - MAIN_HEIGHT_PX },
  });
  const residualArea = plotArea({
    widthPx,
    heightPx,
    marginsPx: { top: mainArea.bottomPx + GAP_PX, right: MARGINS.right, left: MARGINS.left, bottom: BOTTOM_PX },
  });

  const frames = [...(sweep.frames ?? [])].sort((a, b) => a.positionMm - b.positionMm);
  const plottedFrames = frames.filter((f) => f.focusValue !== null && Number.isFinite(f.focusValue));
  const unplottedFrames = frames.filter((f) => !(f.focusValue !== null && Number.isFinite(f.focusValue)));
  const peaks = sweepPeaks(sweep);
  const halfWidthsMm = peaks.map((p) => coverageFactor * p.standardUncertaintyMm);

  const segments = sweepPositionAxis({ sweep, bandHalfWidthsMm: halfWidthsMm, leftPx: mainArea.leftPx, rightPx: mainArea.rightPx });
  const panels = segments.map((segment) => ({
    segment,
    mainArea: areaBetween(mainArea, segment.leftPx, segment.rightPx),
    residualArea: areaBetween(residualArea, segment.leftPx, segment.rightPx),
  }));
  const xPx = (positionMm: number) => positionToPx(segments, positionMm);

  const values = [
    ...plottedFrames.map((f) => f.focusValue as number),
    ...peaks.flatMap((p) => p.curve.map((c) => c.value)),
  ].filter(Number.isFinite);
  const high = values.length ? Math.max(...values) : 1;
  const low = values.length ? Math.min(0, ...values) : 0;
  const yScale = scaleLinear()
    .domain([low, high + 0.06 * (high - low || 1)])
    .nice(5)
    .range([mainArea.bottomPx, mainArea.topPx]);

  const residuals = frames.map((f) => f.focusResidual).filter((r): r is number => r !== null && Number.isFinite(r));
  const residualHalfRange = residuals.length ? Math.max(...residuals.map(Math.abs)) * 1.15 : 0;
  const residualScale = scaleLinear()
    .domain([-(residualHalfRange || 1), residualHalfRange || 1])
    .nice(4)
    .range([residualArea.bottomPx, residualArea.topPx]);

  return {
    widthPx,
    heightPx,
    mainArea,
    residualArea,
    panels,
    xPx,
    yScale,
    residualScale,
    plottedFrames,
    unplottedFrames,
    peaks: peaks.map((peak, index) => ({
      ...peak,
      expandedUncertaintyMm: halfWidthsMm[index],
      xPx: xPx(peak.bestFocusPositionMm),
      bandLeftPx: xPx(peak.bestFocusPositionMm - halfWidthsMm[index]),
      bandRightPx: xPx(peak.bestFocusPositionMm + halfWidthsMm[index]),
      peakValue: interpolateCurve(peak.curve, peak.bestFocusPositionMm),
    })),
  };
}
