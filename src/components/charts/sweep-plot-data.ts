import { scaleLinear, type ScaleLinear } from 'd3-scale';
import type { FrameAnalysis, FrameRejection, FrameRejectionReason, SweepResult } from '@shared/schemas/measurement-result';

export const REJECTION_REASON_WORDS: Record<FrameRejectionReason, string> = {
  undecodable: 'could not be decoded',
  saturated: 'saturated (clipped highlights)',
  'target-lost': 'target not found',
  outlier: 'outlier from the fitted curve',
  excluded: 'excluded by the technician',
};

/** One best-focus estimate of a sweep (two for a displacement sweep). */
export interface SweepPeak {
  /** "z₀", or "z₁"/"z₂" for a displacement sweep. */
  symbol: string;
  bestFocusPositionMm: number;
  standardUncertaintyMm: number;
  curve: { positionMm: number; value: number }[];
  modelName: string | null;
}

const SUBSCRIPTS = ['₀', '₁', '₂', '₃'];

/** The peaks of a sweep, from its fits when present, else from the summary fields. */
export function sweepPeaks(sweep: SweepResult): SweepPeak[] {
  const fits = sweep.focusFits ?? [];
  const symbolFor = (index: number, count: number) => `z${count === 1 ? SUBSCRIPTS[0] : SUBSCRIPTS[index + 1]}`;
  if (fits.length > 0) {
    return fits.map((fit, index) => ({
      symbol: symbolFor(index, fits.length),
      bestFocusPositionMm: fit.bestFocusPositionMm,
      standardUncertaintyMm: fit.standardUncertaintyMm,
      curve: fit.curve,
      modelName: fit.modelName,
    }));
  }
  if (sweep.bestFocusPositionsMm) {
    return sweep.bestFocusPositionsMm.map((positionMm, index) => ({
      symbol: symbolFor(index, 2),
      bestFocusPositionMm: positionMm,
      standardUncertaintyMm: sweep.bestFocusStandardUncertaintiesMm?.[index] ?? 0,
      curve: [],
      modelName: null,
    }));
  }
  if (sweep.bestFocusPositionMm !== undefined) {
    return [
      {
        symbol: symbolFor(0, 1),
        bestFocusPositionMm: sweep.bestFocusPositionMm,
        standardUncertaintyMm: sweep.bestFocusStandardUncertaintyMm ?? 0,
        curve: [],
        modelName: null,
      },
    ];
  }
  return [];
}

/** "s1/0007.png at 451.54 mm — rejected: saturated (clipped highlights); 3.4 % of pixels at full scale". */
export function frameTitle(frame: FrameAnalysis, rejection?: FrameRejection): string {
  const base = `${frame.file} at ${frame.positionMm.toFixed(3)} mm`;
  if (frame.status === 'used') return `${base} — used`;
  const reason = frame.reason ?? rejection?.reason;
  const words = reason ? REJECTION_REASON_WORDS[reason] : 'no reason recorded';
  return `${base} — rejected: ${words}${rejection?.detail ? `; ${rejection.detail}` : ''}`;
}

export function rejectionsByFile(sweep: SweepResult): Map<string, FrameRejection> {
  return new Map(sweep.framesRejected.map((rejection) => [rejection.file, rejection]));
}

/** A stretch of the rail drawn with its own x scale; a displacement sweep usually has two, one around each sharp lens position. */
export interface PositionSegment {
  domainMm: [number, number];
  xScale: ScaleLinear<number, number>;
  leftPx: number;
  rightPx: number;
}

export interface PositionAxisOptions {
  sweep: SweepResult;
  /** Half-widths of the best-focus bands to keep in view, one per peak. */
  bandHalfWidthsMm?: number[];
  leftPx: number;
  rightPx: number;
  /** Space between two segments, where the break marks go. */
  gapPx?: number;
}

/**
 * The x axis of a sweep's plots. Every frame and every best-focus band is in
 * view, padded by 3 % each side. When a sweep has two peaks whose frames lie
 * in two groups separated by more than half the whole span (a displacement
 * sweep, where the lens is moved near each sharp position only), the axis is
 * broken into two segments of equal width so that neither peak is squeezed.
 */
export function sweepPositionAxis(options: PositionAxisOptions): PositionSegment[] {
  const { sweep, bandHalfWidthsMm = [], leftPx, rightPx, gapPx = 22 } = options;
  const peaks = sweepPeaks(sweep);
  const positions = (sweep.frames ?? []).map((f) => f.positionMm);
  peaks.forEach((peak, index) => {
    const half = bandHalfWidthsMm[index] ?? 0;
    positions.push(peak.bestFocusPositionMm - half, peak.bestFocusPositionMm + half);
  });
  const sorted = positions.filter(Number.isFinite).sort((a, b) => a - b);
  if (sorted.length === 0) return [segment([0, 1], leftPx, rightPx)];
  const low = sorted[0];
  const high = sorted[sorted.length - 1];
  let split = -1;
  if (peaks.length === 2) {
    let widestGap = 0;
    for (let i = 1; i < sorted.length; i++) {
      if (sorted[i] - sorted[i - 1] > widestGap) {
        widestGap = sorted[i] - sorted[i - 1];
        split = i;
      }
    }
    const [first, second] = [...peaks].sort((a, b) => a.bestFocusPositionMm - b.bestFocusPositionMm);
    const separatesPeaks = first.bestFocusPositionMm < sorted[split] && second.bestFocusPositionMm >= sorted[split];
    if (!(widestGap > 0.5 * (high - low) && separatesPeaks)) split = -1;
  }
  if (split < 0) return [segment(padded(low, high), leftPx, rightPx)];
  const middlePx = (leftPx + rightPx) / 2;
  return [
    segment(padded(low, sorted[split - 1]), leftPx, middlePx - gapPx / 2),
    segment(padded(sorted[split], high), middlePx + gapPx / 2, rightPx),
  ];
}

function padded(low: number, high: number): [number, number] {
  const span = high - low || Math.max(Math.abs(low) * 0.01, 1);
  return [low - 0.03 * span, high + 0.03 * span];
}

function segment(domainMm: [number, number], leftPx: number, rightPx: number): PositionSegment {
  return { domainMm, xScale: scaleLinear().domain(domainMm).range([leftPx, rightPx]), leftPx, rightPx };
}

/** The segment that holds a position (the nearest one when it falls in the break). */
export function segmentFor(segments: PositionSegment[], positionMm: number): PositionSegment {
  if (segments.length === 1) return segments[0];
  const inside = segments.find((s) => positionMm >= s.domainMm[0] && positionMm <= s.domainMm[1]);
  if (inside) return inside;
  return positionMm < segments[1].domainMm[0] - (segments[1].domainMm[0] - segments[0].domainMm[1]) / 2 ? segments[0] : segments[1];
}

/** Pixel x of a rail position on a (possibly broken) axis. */
export function positionToPx(segments: PositionSegment[], positionMm: number): number {
  return segmentFor(segments, positionMm).xScale(positionMm);
}

/** The value of a sampled curve at a position, by linear interpolation (null outside it). */
export function interpolateCurve(curve: { positionMm: number; value: number }[], positionMm: number): number | null {
  if (curve.length === 0) return null;
  const sorted = [...curve].sort((a, b) => a.positionMm - b.positionMm);
  if (positionMm < sorted[0].positionMm || positionMm > sorted[sorted.length - 1].positionMm) return null;
  for (let i = 1; i < sorted.length; i++) {
    const a = sorted[i - 1];
    const b = sorted[i];
    if (positionMm <= b.positionMm) {
      const t = b.positionMm === a.positionMm ? 0 : (positionMm - a.positionMm) / (b.positionMm - a.positionMm);
      return a.value + t * (b.value - a.value);
    }
  }
  return sorted[sorted.length - 1].value;
}
