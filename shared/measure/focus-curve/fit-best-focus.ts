/**
 * Best-focus position from a through-focus curve (focus measure against rail
 * position): a peaked model fitted by least squares to the points around the
 * maximum, with robust (MAD) rejection of outlying frames, and the standard
 * uncertainty of the peak position from s²·(JᵀJ)⁻¹. fitTwoBestFoci does the
 * same for displacement sweeps, which have two peaks.
 */
import { InvalidOptionError } from '../fit/invalid-option-error';
import { levenbergMarquardtFit, type LevenbergMarquardtFitResult } from '../fit/levenberg-marquardt-fit';
import { linearLeastSquares } from '../fit/linear-least-squares';
import { NoFocusPeakError } from './no-focus-peak-error';
import { focusPeakModels, type FocusPeakModel, type FocusPeakModelName } from './peak-models';

export { NoFocusPeakError } from './no-focus-peak-error';
export type { FocusPeakModelName } from './peak-models';

export interface FitBestFocusOptions {
  positionsMm: number[];
  focusValues: number[];
  model?: FocusPeakModelName;
  /** Half-width of the fitted window, in model widths (`widthMm`) around the peak (default 3). */
  windowHalfWidth?: number;
  /** Rejection threshold for residuals, in robust standard deviations 1.4826·MAD (default 4). */
  outlierThreshold?: number;
}

export interface BestFocusFit {
  bestFocusPositionMm: number;
  standardUncertaintyMm: number;
  degreesOfFreedom: number;
  modelName: FocusPeakModelName;
  /** baseline, amplitude, bestFocusPositionMm, widthMm. */
  parameters: Record<string, number>;
  parameterStandardUncertainties: Record<string, number>;
  /** Covariance of [baseline, amplitude, bestFocusPositionMm, widthMm]. */
  covariance: number[][];
  evaluate(positionMm: number): number;
  /** focus value − model, per input point; NaN for points not used (outside the window, or rejected). */
  residuals: number[];
  /** focus value − model for every input point, used or not. */
  residualsAllPoints: number[];
  usedIndices: number[];
  outlierIndices: number[];
  /** Model value at the peak, baseline + amplitude. */
  peakValue: number;
  baseline: number;
  /** The model's width parameter: Gaussian standard deviation, or Lorentzian half-width at half maximum. */
  widthMm: number;
  residualStandardDeviation: number;
  converged: boolean;
}

const PARAMETER_NAMES = ['baseline', 'amplitude', 'bestFocusPositionMm', 'widthMm'] as const;
const MINIMUM_POINTS = 5;
const MINIMUM_WINDOW_POINTS = 7;
const MINIMUM_POINTS_EACH_SIDE = 2;

interface CheckedFitBestFocusOptions {
  positionsMm: number[];
  focusValues: number[];
  model: FocusPeakModel;
  windowHalfWidth: number;
  outlierThreshold: number;
}

export function checkFitBestFocusOptions(options: FitBestFocusOptions): CheckedFitBestFocusOptions {
  const { positionsMm, focusValues, model = 'gaussian', windowHalfWidth = 3, outlierThreshold = 4 } = options;
  if (!Array.isArray(positionsMm) || !Array.isArray(focusValues)) {
    throw new InvalidOptionError('Options positionsMm and focusValues must be arrays of numbers.');
  }
  if (positionsMm.length !== focusValues.length) {
    throw new InvalidOptionError(
      `Options positionsMm and focusValues must have the same length (${positionsMm.length} positions, ${focusValues.length} focus values).`,
    );
  }
  positionsMm.forEach((z, i) => {
    if (!Number.isFinite(z)) throw new InvalidOptionError(`Option positionsMm value ${i + 1} is not a finite number.`);
  });
  focusValues.forEach((v, i) => {
    if (!Number.isFinite(v)) throw new InvalidOptionError(`Option focusValues value ${i + 1} is not a finite number.`);
  });
  if (!(model in focusPeakModels)) throw new InvalidOptionError(`Option model must be 'gaussian' or 'lorentzian' (got '${model}').`);
  if (!(windowHalfWidth > 0) || !Number.isFinite(windowHalfWidth)) {
    throw new InvalidOptionError(`Option windowHalfWidth must be a positive number of peak widths (got ${windowHalfWidth}).`);
  }
  if (!(outlierThreshold > 0)) {
    throw new InvalidOptionError(`Option outlierThreshold must be a positive number of robust standard deviations (got ${outlierThreshold}).`);
  }
  return { positionsMm, focusValues, model: focusPeakModels[model], windowHalfWidth, outlierThreshold };
}

function median(values: number[]): number {
  const sorted = values.slice().sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : 0.5 * (sorted[mid - 1] + sorted[mid]);
}

/** Three-point running median; keeps a single spike from being taken for the peak. */
export function runningMedianOfThree(values: number[]): number[] {
  return values.map((v, i) => (i === 0 || i === values.length - 1 ? v : median([values[i - 1], v, values[i + 1]])));
}

interface PeakGuess {
  peakPositionMm: number;
  gaussianSigmaMm: number;
  amplitude: number;
  baseline: number;
}

/** Parabola through ln(value − floor) near the maximum: Gaussian centre, σ and height. */
function guessPeak(z: number[], v: number[]): PeakGuess {
  const n = z.length;
  const smoothed = runningMedianOfThree(v);
  let peakIndex = 0;
  for (let i = 1; i < n; i++) if (smoothed[i] > smoothed[peakIndex]) peakIndex = i;
  if (peakIndex === 0 || peakIndex === n - 1) {
    throw new NoFocusPeakError(
      `the focus measure is highest at the ${peakIndex === 0 ? 'start' : 'end'} of the sweep (${z[peakIndex]} mm), so best focus lies outside it or the curve is monotonic`,
    );
  }
  const floor = Math.min(...v);
  const range = smoothed[peakIndex] - floor;
  if (!(range > 0)) throw new NoFocusPeakError('the focus measure does not change along the sweep');
  let low = peakIndex;
  let high = peakIndex;
  while (low > 0 && smoothed[low - 1] - floor >= 0.25 * range) low--;
  while (high < n - 1 && smoothed[high + 1] - floor >= 0.25 * range) high++;
  if (high - low < 2) {
    low = peakIndex - 1;
    high = peakIndex + 1;
  }
  const originMm = z[peakIndex];
  const design: number[][] = [];
  const observations: number[] = [];
  for (let i = low; i <= high; i++) {
    const d = z[i] - originMm;
    design.push([1, d, d * d]);
    observations.push(Math.log(Math.max(v[i] - floor, 0.01 * range)));
  }
  const fallbackSigma = Math.max((z[high] - z[low]) / (2 * 1.665), 0.5 * Math.min(z[peakIndex] - z[peakIndex - 1], z[peakIndex + 1] - z[peakIndex]));
  const fallback: PeakGuess = { peakPositionMm: originMm, gaussianSigmaMm: fallbackSigma, amplitude: range, baseline: floor };
  let parabola: number[];
  try {
    parabola = linearLeastSquares({ design, observations }).parameters;
  } catch {
    return fallback;
  }
  const [alpha, beta, gamma] = parabola;
  if (!(gamma < 0)) return fallback;
  const offset = -beta / (2 * gamma);
  const sigma = Math.sqrt(-1 / (2 * gamma));
  const peakPositionMm = originMm + offset;
  if (!(peakPositionMm > z[low - (low > 0 ? 1 : 0)] && peakPositionMm < z[high + (high < n - 1 ? 1 : 0)]) || !Number.isFinite(sigma)) {
    return fallback;
  }
  const amplitude = Math.exp(alpha - (beta * beta) / (4 * gamma));
  return { peakPositionMm, gaussianSigmaMm: sigma, amplitude: Number.isFinite(amplitude) ? amplitude : range, baseline: floor };
}

interface PeakFitState {
  parameters: number[];
  fit: LevenbergMarquardtFitResult;
  used: number[];
}

export function fitBestFocus(options: FitBestFocusOptions): BestFocusFit {
  const { positionsMm, focusValues, model, windowHalfWidth, outlierThreshold } = checkFitBestFocusOptions(options);
  const n = positionsMm.length;
  if (n < MINIMUM_POINTS) throw new NoFocusPeakError(`only ${n} frames, at least ${MINIMUM_POINTS} are needed to fit a peak`);

  const order = positionsMm.map((_, i) => i).sort((a, b) => positionsMm[a] - positionsMm[b]);
  const z = order.map((i) => positionsMm[i]);
  const v = order.map((i) => focusValues[i]);
  const guess = guessPeak(z, v);

  // Fit in normalised units (position about the guessed peak in guessed widths, value about the floor in units
  // of its range) so that the parameters are all of order one whatever the focus measure's scale.
  const positionOrigin = guess.peakPositionMm;
  const positionScale = guess.gaussianSigmaMm;
  const valueOrigin = guess.baseline;
  const valueScale = Math.max(...v) - valueOrigin || 1;
  const zn = z.map((p) => (p - positionOrigin) / positionScale);
  const vn = v.map((p) => (p - valueOrigin) / valueScale);

  let parameters = [0, guess.amplitude / valueScale, 0, model.widthFromGaussianSigma(1)];
  const outliers = new Set<number>();
  const maximumOutliers = Math.floor(0.2 * n);
  let state: PeakFitState | null = null;

  const selectWindow = (centre: number, width: number): number[] => {
    const candidates = zn.map((_, i) => i).filter((i) => !outliers.has(i));
    const inside = candidates.filter((i) => Math.abs(zn[i] - centre) <= windowHalfWidth * width);
    if (inside.length >= MINIMUM_WINDOW_POINTS || inside.length === candidates.length) return inside;
    // Too few points in the window (a coarse sweep): take the nearest points to the peak instead.
    return candidates
      .sort((a, b) => Math.abs(zn[a] - centre) - Math.abs(zn[b] - centre))
      .slice(0, Math.min(MINIMUM_WINDOW_POINTS, candidates.length))
      .sort((a, b) => a - b);
  };

  for (let outlierRound = 0; outlierRound <= maximumOutliers; outlierRound++) {
    let used = selectWindow(parameters[2], Math.abs(parameters[3]));
    for (let windowRound = 0; windowRound < 10; windowRound++) {
      if (used.length < MINIMUM_POINTS) {
        throw new NoFocusPeakError(`only ${used.length} usable frames near the peak, at least ${MINIMUM_POINTS} are needed`);
      }
      const fit = levenbergMarquardtFit({
        x: used.map((i) => zn[i]),
        y: used.map((i) => vn[i]),
        model: model.evaluate,
        jacobian: model.jacobian,
        initialParameters: parameters,
        maxIterations: 100,
      });
      if (!fit.parameters.every(Number.isFinite)) throw new NoFocusPeakError('the peak model could not be fitted to the focus curve');
      parameters = fit.parameters.slice();
      parameters[3] = Math.abs(parameters[3]);
      state = { parameters, fit, used };
      const next = selectWindow(parameters[2], parameters[3]);
      if (next.length === used.length && next.every((i, k) => i === used[k])) break;
      used = next;
    }
    if (!state) break;
    if (outliers.size >= maximumOutliers) break;
    const f = model.evaluate(state.parameters);
    const residuals = state.used.map((i) => vn[i] - f(zn[i]));
    const centre = median(residuals);
    const robustSigma = Math.max(1.4826 * median(residuals.map((r) => Math.abs(r - centre))), 1e-12);
    let worst = -1;
    let worstScore = outlierThreshold;
    residuals.forEach((r, k) => {
      const score = Math.abs(r - centre) / robustSigma;
      if (score > worstScore) {
        worstScore = score;
        worst = state!.used[k];
      }
    });
    if (worst < 0 || state.used.length - 1 < MINIMUM_POINTS) break;
    outliers.add(worst);
  }
  if (!state) throw new NoFocusPeakError('the peak model could not be fitted to the focus curve');

  const [cn, an, z0n, wn] = state.parameters;
  if (!(an > 0)) throw new NoFocusPeakError('the fitted curve has a dip, not a peak');
  const bestFocusPositionMm = positionOrigin + positionScale * z0n;
  if (!(bestFocusPositionMm >= z[0] && bestFocusPositionMm <= z[n - 1])) {
    throw new NoFocusPeakError(`the fitted peak (${bestFocusPositionMm.toFixed(3)} mm) lies outside the sweep (${z[0]} to ${z[n - 1]} mm)`);
  }
  const below = state.used.filter((i) => zn[i] < z0n).length;
  const above = state.used.filter((i) => zn[i] > z0n).length;
  // A peak seen from one side only is an extrapolation, not a measurement.
  if (below < MINIMUM_POINTS_EACH_SIDE || above < MINIMUM_POINTS_EACH_SIDE) {
    throw new NoFocusPeakError(
      `the fitted peak (${bestFocusPositionMm.toFixed(3)} mm) has ${below} frames before it and ${above} after it; at least ${MINIMUM_POINTS_EACH_SIDE} on each side are needed`,
    );
  }
  const scales = [valueScale, valueScale, positionScale, positionScale];
  const covariance = state.fit.covariance.map((row, i) => row.map((c, j) => c * scales[i] * scales[j]));
  const standardUncertainties = covariance.map((row, i) => Math.sqrt(row[i]));
  if (!standardUncertainties.every(Number.isFinite)) {
    throw new NoFocusPeakError('the frames near the peak do not determine its position (singular fit)');
  }
  const physical = [valueOrigin + valueScale * cn, valueScale * an, bestFocusPositionMm, positionScale * wn];
  const evaluateNormalised = model.evaluate(state.parameters);
  const evaluate = (positionMm: number) => valueOrigin + valueScale * evaluateNormalised((positionMm - positionOrigin) / positionScale);

  const usedOriginal = state.used.map((i) => order[i]).sort((a, b) => a - b);
  const usedSet = new Set(usedOriginal);
  const residualsAllPoints = positionsMm.map((p, i) => focusValues[i] - evaluate(p));
  const residuals = residualsAllPoints.map((r, i) => (usedSet.has(i) ? r : NaN));
  const parametersRecord: Record<string, number> = {};
  const uncertaintyRecord: Record<string, number> = {};
  PARAMETER_NAMES.forEach((name, i) => {
    parametersRecord[name] = physical[i];
    uncertaintyRecord[name] = standardUncertainties[i];
  });
  return {
    bestFocusPositionMm,
    standardUncertaintyMm: standardUncertainties[2],
    degreesOfFreedom: state.fit.degreesOfFreedom,
    modelName: model.name,
    parameters: parametersRecord,
    parameterStandardUncertainties: uncertaintyRecord,
    covariance,
    evaluate,
    residuals,
    residualsAllPoints,
    usedIndices: usedOriginal,
    outlierIndices: [...outliers].map((i) => order[i]).sort((a, b) => a - b),
    peakValue: physical[0] + physical[1],
    baseline: physical[0],
    widthMm: physical[3],
    residualStandardDeviation: valueScale * state.fit.residualStandardDeviation,
    converged: state.fit.converged,
  };
}

/*
 * Two best-focus positions from one displacement sweep (the lens moves between
 * a fixed object and sensor and is sharp twice). The two most prominent maxima
 * of the lightly smoothed curve are taken, the sweep is split at the lowest
 * point between them, and each part is fitted on its own by fitBestFocus.
 */

export interface FitTwoBestFociOptions extends FitBestFocusOptions {
  /**
   * Smallest prominence a maximum needs to count as a focus peak, as a fraction
   * of the curve's full range (default 0.1). A maximum must also stand 5 noise
   * standard deviations above its surroundings.
   */
  minimumProminenceFraction?: number;
}

/** Topographic prominence of each local maximum (height above the higher of the two lowest points separating it from higher ground). */
function prominentMaxima(values: number[]): { index: number; prominence: number }[] {
  const n = values.length;
  const maxima: { index: number; prominence: number }[] = [];
  for (let i = 1; i < n - 1; i++) {
    if (!(values[i] > values[i - 1] && values[i] >= values[i + 1])) continue;
    let leftMinimum = values[i];
    for (let k = i - 1; k >= 0 && values[k] <= values[i]; k--) leftMinimum = Math.min(leftMinimum, values[k]);
    let rightMinimum = values[i];
    for (let k = i + 1; k < n && values[k] <= values[i]; k++) rightMinimum = Math.min(rightMinimum, values[k]);
    maxima.push({ index: i, prominence: values[i] - Math.max(leftMinimum, rightMinimum) });
  }
  return maxima.sort((a, b) => b.prominence - a.prominence);
}

export function fitTwoBestFoci(options: FitTwoBestFociOptions): [BestFocusFit, BestFocusFit] {
  const { positionsMm, focusValues } = checkFitBestFocusOptions(options);
  const minimumProminenceFraction = options.minimumProminenceFraction ?? 0.1;
  if (!(minimumProminenceFraction > 0 && minimumProminenceFraction < 1)) {
    throw new InvalidOptionError(`Option minimumProminenceFraction must lie strictly between 0 and 1 (got ${minimumProminenceFraction}).`);
  }
  const n = positionsMm.length;
  if (n < 10) throw new NoFocusPeakError(`only ${n} frames, a displacement sweep needs at least 10 to show two peaks`);
  const order = positionsMm.map((_, i) => i).sort((a, b) => positionsMm[a] - positionsMm[b]);
  const v = order.map((i) => focusValues[i]);
  const smoothed = runningMedianOfThree(v);
  const range = Math.max(...smoothed) - Math.min(...smoothed);
  // Noise from second differences (v[i−1] − 2v[i] + v[i+1] has variance 6σ² for white noise), which the curve's slope does not inflate.
  const secondDifferences = v.slice(2).map((x, i) => v[i] - 2 * v[i + 1] + x);
  const secondDifferenceCentre = median(secondDifferences);
  const noiseSigma = (1.4826 * median(secondDifferences.map((d) => Math.abs(d - secondDifferenceCentre)))) / Math.sqrt(6);
  const threshold = Math.max(minimumProminenceFraction * range, 5 * noiseSigma);
  const peaks = prominentMaxima(smoothed).filter((p) => p.prominence >= threshold);
  if (peaks.length < 2) {
    throw new NoFocusPeakError(
      `found ${peaks.length === 0 ? 'no' : 'only one'} clear peak, and a lens-displacement sweep needs two (the lens is sharp at two positions)`,
    );
  }
  const [first, second] = [peaks[0].index, peaks[1].index].sort((a, b) => a - b);
  let valley = first;
  for (let i = first; i <= second; i++) if (smoothed[i] < smoothed[valley]) valley = i;

  const fitPart = (sortedIndices: number[]): BestFocusFit => {
    const originalIndices = sortedIndices.map((k) => order[k]);
    const part = fitBestFocus({
      ...options,
      positionsMm: originalIndices.map((i) => positionsMm[i]),
      focusValues: originalIndices.map((i) => focusValues[i]),
    });
    const toOriginal = (indices: number[]) => indices.map((k) => originalIndices[k]).sort((a, b) => a - b);
    const residuals = new Array<number>(n).fill(NaN);
    const residualsAllPoints = positionsMm.map((p, i) => focusValues[i] - part.evaluate(p));
    const usedIndices = toOriginal(part.usedIndices);
    for (const i of usedIndices) residuals[i] = residualsAllPoints[i];
    return { ...part, usedIndices, outlierIndices: toOriginal(part.outlierIndices), residuals, residualsAllPoints };
  };
  const leftIndices = Array.from({ length: valley + 1 }, (_, k) => k);
  const rightIndices = Array.from({ length: n - valley }, (_, k) => valley + k);
  const left = fitPart(leftIndices);
  const right = fitPart(rightIndices);
  return left.bestFocusPositionMm <= right.bestFocusPositionMm ? [left, right] : [right, left];
}
