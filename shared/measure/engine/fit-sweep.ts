import type { FocusPeakFit, FrameAnalysis, SizeThroughFocusFit } from '../../schemas/measurement-result';
import { fitBestFocus, fitTwoBestFoci, NoFocusPeakError } from '../focus-curve/fit-best-focus';
import { lineFit } from '../fit/line-fit';
import { MeasurementError } from './measurement-error';

export const MINIMUM_USABLE_FRAMES = 5;

/** What one fitted focus peak gives the solvers. */
export interface PeakEstimate {
  focus: FocusPeakFit;
  size: SizeThroughFocusFit;
}

type BestFocusFit = ReturnType<typeof fitBestFocus>;

/**
 * Fits the focus curve of one sweep (one peak, or two for a displacement
 * sweep), marks outlying frames as rejected, and fits the target size
 * through focus near each peak. Mutates `frames` (status, residuals).
 */
export function fitSweep(frames: FrameAnalysis[], options: { sweepLabel: string; peaks: 1 | 2 }): PeakEstimate[] {
  const usable = frames.filter((f) => f.status === 'used' && f.focusValue !== null && Number.isFinite(f.focusValue));
  if (usable.length < MINIMUM_USABLE_FRAMES * options.peaks) {
    throw new MeasurementError(
      'too-few-frames',
      `too few usable frames in ${options.sweepLabel}: ${usable.length} of ${frames.length} (need at least ${MINIMUM_USABLE_FRAMES * options.peaks}); see the rejected frames`,
    );
  }
  const positionsMm = usable.map((f) => f.positionMm);
  const focusValues = usable.map((f) => f.focusValue as number);

  let fits: BestFocusFit[];
  try {
    fits = bestFittingPeaks(positionsMm, focusValues, options.peaks);
  } catch (error) {
    if (error instanceof NoFocusPeakError) {
      const hint =
        options.peaks === 2
          ? ' (the displacement method needs two sharp lens positions, so the object-to-sensor distance must exceed four focal lengths)'
          : '';
      const detail = error.message.replace(/^no focus peak inside the sweep:\s*/, '');
      throw new MeasurementError('no-focus-peak', `no focus peak in ${options.sweepLabel}: ${detail}${hint}`);
    }
    throw error;
  }

  for (const fit of fits) {
    fit.outlierIndices.forEach((i) => {
      usable[i].status = 'rejected';
      usable[i].reason = 'outlier';
    });
    fit.usedIndices.forEach((i) => {
      const r = fit.residuals[i];
      if (Number.isFinite(r)) usable[i].focusResidual = r;
    });
  }

  return fits.map((fit) => ({
    focus: toFocusPeakFit(fit, positionsMm),
    size: fitSizeNearFocus(usable, fit, options.sweepLabel),
  }));
}

/** Points either side of the peak used by the fit, in model widths: enough for degrees of freedom, few enough to stay on the peak. */
const FOCUS_WINDOW_HALF_WIDTH = 6;

/**
 * Fits both peak models and keeps the one whose residual scatter, relative
 * to its peak height, is smaller: a sharply sampled peak is near Gaussian, a
 * coarsely sampled one with long defocus tails near Lorentzian.
 */
function bestFittingPeaks(positionsMm: number[], focusValues: number[], peaks: 1 | 2): BestFocusFit[] {
  const candidates: BestFocusFit[][] = [];
  let firstError: unknown;
  for (const model of ['lorentzian', 'gaussian'] as const) {
    try {
      const options = { positionsMm, focusValues, model, windowHalfWidth: FOCUS_WINDOW_HALF_WIDTH };
      candidates.push(peaks === 1 ? [fitBestFocus(options)] : fitTwoBestFoci(options));
    } catch (error) {
      firstError ??= error;
    }
  }
  if (candidates.length === 0) throw firstError;
  const badness = (fits: BestFocusFit[]) =>
    Math.max(...fits.map((f) => f.residualStandardDeviation / Math.max(Math.abs(f.peakValue - f.baseline), 1e-300)));
  return candidates.reduce((best, next) => (badness(next) < badness(best) ? next : best));
}

function toFocusPeakFit(fit: BestFocusFit, positionsMm: number[]): FocusPeakFit {
  const window = fit.usedIndices.map((i) => positionsMm[i]);
  const lo = Math.min(...window);
  const hi = Math.max(...window);
  const samples = 80;
  const curve = Array.from({ length: samples + 1 }, (_, k) => {
    const positionMm = lo + ((hi - lo) * k) / samples;
    return { positionMm, value: fit.evaluate(positionMm) };
  });
  return {
    bestFocusPositionMm: fit.bestFocusPositionMm,
    standardUncertaintyMm: fit.standardUncertaintyMm,
    degreesOfFreedom: fit.degreesOfFreedom,
    modelName: fit.modelName,
    parameters: fit.parameters,
    widthMm: fit.widthMm,
    curve,
  };
}

/**
 * The apparent target size changes linearly through focus (chief rays pass
 * through the exit pupil), so the size at best focus comes from a line
 * fitted to the frames near focus, never from a single frame.
 */
function fitSizeNearFocus(usable: FrameAnalysis[], fit: BestFocusFit, sweepLabel: string): SizeThroughFocusFit {
  const z0 = fit.bestFocusPositionMm;
  const halfWindow = Math.max(2.5 * fit.widthMm, 1e-9);
  let candidates = usable.filter((f) => f.status === 'used' && f.sizePx !== null && Math.abs(f.positionMm - z0) <= halfWindow);
  if (candidates.length < 4) {
    candidates = usable
      .filter((f) => f.status === 'used' && f.sizePx !== null)
      .sort((a, b) => Math.abs(a.positionMm - z0) - Math.abs(b.positionMm - z0))
      .slice(0, 7);
  }
  if (candidates.length < 3) {
    throw new MeasurementError('too-few-frames', `too few frames with a measured target size near best focus in ${sweepLabel}`);
  }

  let points = candidates;
  for (let round = 0; round < 3; round++) {
    const line = lineFit({ x: points.map((f) => f.positionMm), y: points.map((f) => f.sizePx as number) });
    const residuals = points.map((f) => (f.sizePx as number) - line.evaluate(f.positionMm));
    const scale = robustScale(residuals);
    const keep = points.filter((_, i) => scale === 0 || Math.abs(residuals[i]) <= 4 * scale);
    if (keep.length === points.length || keep.length < 3) break;
    points.filter((f) => !keep.includes(f)).forEach((f) => {
      f.status = 'rejected';
      f.reason = 'outlier';
    });
    points = keep;
  }
  const xs = points.map((f) => f.positionMm);
  const line = lineFit({ x: xs, y: points.map((f) => f.sizePx as number) });
  return {
    slopePxPerMm: line.slope,
    interceptPx: line.intercept,
    sizeAtBestFocusPx: line.evaluate(z0),
    sizeAtBestFocusStandardUncertaintyPx: line.standardUncertaintyAt(z0),
    degreesOfFreedom: line.degreesOfFreedom,
    positionsMm: [Math.min(...xs), Math.max(...xs)],
  };
}

function robustScale(values: number[]): number {
  const med = median(values);
  return 1.4826 * median(values.map((v) => Math.abs(v - med)));
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}
