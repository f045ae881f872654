import type { GreyImage, PixelRect, TargetPattern, TargetPolarity } from '../types';
import { fitBackgroundSurface } from './fit-background-surface';
import { histogram } from './histogram';
import { labelComponents, type ConnectedComponent } from './label-components';
import { otsuThreshold } from './otsu-threshold';
import { quantileInPlace } from '../statistics/select-in-place';
import { componentBoundingBox } from './component-bounding-box';
import { ReusableArray } from '../image/reusable-array';

// Scratch arrays of one detection (see ReusableArray); none of them leaves detectTarget.
const scratch = {
  differences: new ReusableArray((n) => new Float64Array(n)),
  sampledResidual: new ReusableArray((n) => new Float64Array(n)),
  sampledLevels: new ReusableArray((n) => new Float64Array(n)),
  background: new ReusableArray((n) => new Float64Array(n)),
  mask: new ReusableArray((n) => new Uint8Array(n)),
  lowMask: new ReusableArray((n) => new Uint8Array(n)),
};

export interface DetectedBlob {
  /** Background-subtracted, signal-weighted centre of the blob's pixels above the threshold. */
  centroidPx: { x: number; y: number };
  areaPx: number;
  boundingBox: PixelRect;
  /** Mean background-subtracted signal of the blob, positive, in intensity units. */
  contrast: number;
}

export interface TargetDetection {
  pattern: TargetPattern;
  /** As given, or detected: the target is the minority class. */
  polarity: TargetPolarity;
  /** Whole target (both dots for dot-pair) at the half-contrast threshold. */
  boundingBox: PixelRect;
  /** The target's extent down to `blurExtentLevel` of its contrast: how far blur spreads it. */
  blurExtentBox: PixelRect;
  centrePx: { x: number; y: number };
  blobs: DetectedBlob[];
}

export interface DetectTargetOptions {
  pattern: TargetPattern;
  polarity?: TargetPolarity;
  /** Blobs smaller than this are noise or dust; default 6 pixels. */
  minBlobAreaPx?: number;
  /** A blob's contrast must reach this many pixel-noise standard deviations; default 6. */
  minContrastToNoise?: number;
  /** ...and this share of the image's bright level (its 99.9th percentile); default 0.01. */
  minContrastFraction?: number;
  /** Above this share of the image the "target" class is not a target; default 0.4. */
  maxTargetFraction?: number;
  /** Share of the contrast that bounds `blurExtentBox`; default 0.1. */
  blurExtentLevel?: number;
}

const PATTERNS: readonly TargetPattern[] = ['dot-pair', 'square'];
const POLARITIES: readonly TargetPolarity[] = ['dark-on-light', 'light-on-dark'];

export function checkDetectTargetOptions(options: DetectTargetOptions): Required<Omit<DetectTargetOptions, 'polarity'>> & {
  polarity?: TargetPolarity;
} {
  if (!options || !PATTERNS.includes(options.pattern)) {
    throw new RangeError(`pattern must be one of ${PATTERNS.join(', ')} (got ${String(options?.pattern)}).`);
  }
  if (options.polarity !== undefined && !POLARITIES.includes(options.polarity)) {
    throw new RangeError(`polarity must be one of ${POLARITIES.join(', ')} (got ${String(options.polarity)}).`);
  }
  const filled = {
    minBlobAreaPx: 6,
    minContrastToNoise: 6,
    minContrastFraction: 0.01,
    maxTargetFraction: 0.4,
    blurExtentLevel: 0.1,
    ...options,
  };
  const positive = ['minBlobAreaPx', 'minContrastToNoise'] as const;
  for (const name of positive) {
    if (!(Number.isFinite(filled[name]) && filled[name] > 0)) {
      throw new RangeError(`${name} must be a positive number (got ${filled[name]}).`);
    }
  }
  const fractions = ['minContrastFraction', 'maxTargetFraction', 'blurExtentLevel'] as const;
  for (const name of fractions) {
    if (!(filled[name] >= 0 && filled[name] < 1)) {
      throw new RangeError(`${name} must be a number from 0 to below 1 (got ${filled[name]}).`);
    }
  }
  return filled;
}

function unionRect(rects: PixelRect[]): PixelRect {
  const x0 = Math.min(...rects.map((r) => r.x));
  const y0 = Math.min(...rects.map((r) => r.y));
  const x1 = Math.max(...rects.map((r) => r.x + r.width));
  const y1 = Math.max(...rects.map((r) => r.y + r.height));
  return { x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
}

/** Standard deviation of white pixel noise from the median absolute difference of horizontal neighbours. */
function noiseStdDevFromDifferences(signal: Float32Array, width: number, height: number): number {
  const step = Math.max(1, Math.floor((width * height) / 20_000));
  const differences = scratch.differences.take(Math.ceil((width * height - 1) / step));
  let count = 0;
  for (let index = 0; index < width * height - 1; index += step) {
    if ((index + 1) % width === 0) continue;
    differences[count++] = Math.abs(signal[index + 1] - signal[index]);
  }
  return (1.4826 * quantileInPlace(differences, 0.5, count)) / Math.SQRT2;
}

interface ScoredBlob {
  component: ConnectedComponent;
  weightedCentroidPx: { x: number; y: number };
  contrast: number;
  fillRatio: number;
  aspectRatio: number;
}

/**
 * Finds the target on a reduced copy of a frame: flatten the background
 * (robust polynomial surface), split the residual by Otsu's threshold, move the
 * threshold to half-way between the two classes' medians, label 8-connected
 * blobs, keep those that are off the border, big enough and clearly above the
 * noise, then pick the two largest similar blobs (dot-pair) or the largest
 * compact blob (square). Null when no such target is there, or when it is
 * ambiguous (a third similar dot; a second square as large).
 */
export function detectTarget(image: GreyImage, options: DetectTargetOptions): TargetDetection | null {
  const settings = checkDetectTargetOptions(options);
  const { width, height, data } = image;
  const pixelCount = width * height;
  if (width < 8 || height < 8) return null;

  // The surface's own array becomes the residual.
  const residual = fitBackgroundSurface(image).surface;
  for (let k = 0; k < pixelCount; k++) residual[k] = data[k] - residual[k];

  const sampleStep = Math.max(1, Math.floor(pixelCount / 20_000));
  const sampleCount = Math.ceil(pixelCount / sampleStep);
  const sampledResidual = scratch.sampledResidual.take(sampleCount);
  const sampledLevels = scratch.sampledLevels.take(sampleCount);
  for (let k = 0, s = 0; k < pixelCount; k += sampleStep, s++) {
    sampledResidual[s] = residual[k];
    sampledLevels[s] = data[k];
  }
  const noiseStdDev = noiseStdDevFromDifferences(residual, width, height);
  const brightLevel = quantileInPlace(sampledLevels, 0.999);
  const minContrast = Math.max(settings.minContrastToNoise * noiseStdDev, settings.minContrastFraction * Math.abs(brightLevel));

  const split = splitByOtsu(residual, sampledResidual, settings.polarity, settings.maxTargetFraction, minContrast)
    ?? splitByOutliers(residual, sampledResidual, settings.polarity, minContrast);
  if (!split) return null;
  const { polarity, backgroundLevel, targetLevel } = split;
  const sign = polarity === 'light-on-dark' ? 1 : -1;
  const threshold = (backgroundLevel + targetLevel) / 2;

  const mask = scratch.mask.take(pixelCount);
  for (let k = 0; k < pixelCount; k++) mask[k] = sign * (residual[k] - threshold) > 0 ? 1 : 0;
  const { labels, components } = labelComponents(mask, { width, height });

  const signalSums = new Float64Array(components.length + 1);
  const signalX = new Float64Array(components.length + 1);
  const signalY = new Float64Array(components.length + 1);
  const positiveSums = new Float64Array(components.length + 1);
  for (let y = 0, k = 0; y < height; y++) {
    for (let x = 0; x < width; x++, k++) {
      const label = labels[k];
      if (label === 0) continue;
      const signal = sign * (residual[k] - backgroundLevel);
      signalSums[label] += signal;
      if (signal > 0) {
        positiveSums[label] += signal;
        signalX[label] += signal * x;
        signalY[label] += signal * y;
      }
    }
  }
  const plausible: ScoredBlob[] = [];
  for (const component of components) {
    if (component.touchesBorder || component.areaPx < settings.minBlobAreaPx) continue;
    const contrast = signalSums[component.label] / component.areaPx;
    if (!(contrast >= minContrast) || contrast <= 0) continue;
    const { width: bw, height: bh } = component.boundingBox;
    plausible.push({
      component,
      weightedCentroidPx: {
        x: signalX[component.label] / positiveSums[component.label],
        y: signalY[component.label] / positiveSums[component.label],
      },
      contrast,
      fillRatio: component.areaPx / (bw * bh),
      aspectRatio: Math.max(bw, bh) / Math.min(bw, bh),
    });
  }

  const chosen = options.pattern === 'dot-pair' ? pickDotPair(plausible) : pickSquare(plausible);
  if (!chosen) return null;

  // Only the components holding the chosen blobs matter, so they are filled from the blobs rather than all labelled.
  const lowLevel = backgroundLevel + sign * settings.blurExtentLevel * Math.min(...chosen.map((b) => b.contrast));
  const lowMask = scratch.lowMask.take(pixelCount);
  for (let k = 0; k < pixelCount; k++) lowMask[k] = sign * (residual[k] - lowLevel) > 0 ? 1 : 0;
  const boundingBox = unionRect(chosen.map((b) => b.component.boundingBox));
  const extentBoxes = chosen.flatMap((b) => {
    const box = componentBoundingBox(lowMask, { width, height }, b.component.firstPixelIndex);
    return box ? [box] : [];
  });
  const blurExtentBox = unionRect([boundingBox, ...extentBoxes]);

  const blobs: DetectedBlob[] = chosen.map((b) => ({
    centroidPx: { ...b.weightedCentroidPx },
    areaPx: b.component.areaPx,
    boundingBox: { ...b.component.boundingBox },
    contrast: b.contrast,
  }));
  const centrePx = {
    x: blobs.reduce((s, b) => s + b.centroidPx.x, 0) / blobs.length,
    y: blobs.reduce((s, b) => s + b.centroidPx.y, 0) / blobs.length,
  };
  return { pattern: options.pattern, polarity, boundingBox, blurExtentBox, centrePx, blobs };
}

interface ClassSplit {
  polarity: TargetPolarity;
  backgroundLevel: number;
  targetLevel: number;
}

/** Median residual of the pixels on the target side of `level` (all of them: a small target has few samples). */
function targetSideMedian(residual: Float32Array, level: number, sign: number): number {
  let count = 0;
  for (let k = 0; k < residual.length; k++) if (sign * (residual[k] - level) > 0) count++;
  const values = new Float64Array(count);
  for (let k = 0, i = 0; k < residual.length; k++) if (sign * (residual[k] - level) > 0) values[i++] = residual[k];
  return quantileInPlace(values, 0.5);
}

/**
 * Otsu's split of the residual histogram; the target is the minority class
 * unless the polarity is given. Levels are the two classes' medians, since
 * Otsu's own threshold sits too near the bigger class. Null when the split is
 * not a target (the target class is too big, or the classes too close).
 */
function splitByOtsu(
  residual: Float32Array,
  sample: Float64Array,
  givenPolarity: TargetPolarity | undefined,
  maxTargetFraction: number,
  minContrast: number,
): ClassSplit | null {
  const { counts, lowerValue, binWidth } = histogram(residual, { binCount: 256 });
  const otsu = otsuThreshold(counts);
  if (!otsu) return null;
  const otsuLevel = lowerValue + (otsu.thresholdBin + 1) * binWidth;
  const darkFraction = otsu.lowerClassFraction;
  const polarity = givenPolarity ?? (darkFraction <= 0.5 ? 'dark-on-light' : 'light-on-dark');
  const targetFraction = polarity === 'dark-on-light' ? darkFraction : 1 - darkFraction;
  if (targetFraction === 0 || targetFraction > maxTargetFraction) return null;
  const sign = polarity === 'light-on-dark' ? 1 : -1;
  const background = scratch.background.take(sample.length);
  let backgroundCount = 0;
  for (let k = 0; k < sample.length; k++) if (sign * (sample[k] - otsuLevel) <= 0) background[backgroundCount++] = sample[k];
  if (backgroundCount === 0) return null;
  const backgroundLevel = quantileInPlace(background, 0.5, backgroundCount);
  const targetLevel = targetSideMedian(residual, otsuLevel, sign);
  if (!(sign * (targetLevel - backgroundLevel) >= minContrast)) return null;
  return { polarity, backgroundLevel, targetLevel };
}

/**
 * For a target too small for Otsu's criterion (it then splits the noise): the
 * background is the median residual and the target the pixels beyond it by
 * `minContrast`, on the given side or the side that has more of them.
 */
function splitByOutliers(
  residual: Float32Array,
  sample: Float64Array,
  givenPolarity: TargetPolarity | undefined,
  minContrast: number,
): ClassSplit | null {
  const backgroundLevel = quantileInPlace(Float64Array.from(sample), 0.5);
  let brighter = 0;
  let darker = 0;
  for (let k = 0; k < residual.length; k++) {
    if (residual[k] - backgroundLevel > minContrast) brighter++;
    else if (backgroundLevel - residual[k] > minContrast) darker++;
  }
  const polarity = givenPolarity ?? (darker >= brighter ? 'dark-on-light' : 'light-on-dark');
  const sign = polarity === 'light-on-dark' ? 1 : -1;
  if ((sign > 0 ? brighter : darker) === 0) return null;
  const targetLevel = targetSideMedian(residual, backgroundLevel + sign * minContrast, sign);
  return { polarity, backgroundLevel, targetLevel };
}

/** The two largest round-ish blobs, of similar area, with no third one like them. */
function pickDotPair(plausible: ScoredBlob[]): ScoredBlob[] | null {
  const round = plausible
    .filter((b) => b.fillRatio >= 0.5 && b.aspectRatio <= 2)
    .sort((a, b) => b.component.areaPx - a.component.areaPx);
  if (round.length < 2) return null;
  const [first, second, third] = round;
  if (second.component.areaPx < 0.5 * first.component.areaPx) return null;
  if (third && third.component.areaPx >= 0.5 * second.component.areaPx) return null;
  return [first, second];
}

/** The largest compact blob, when no other blob is half as large. */
function pickSquare(plausible: ScoredBlob[]): ScoredBlob[] | null {
  const compact = plausible
    .filter((b) => b.fillRatio >= 0.45 && b.aspectRatio <= 1.6)
    .sort((a, b) => b.component.areaPx - a.component.areaPx);
  if (compact.length === 0) return null;
  const [first, second] = compact;
  if (second && second.component.areaPx >= 0.5 * first.component.areaPx) return null;
  return [first];
}
