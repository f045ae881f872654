import type { BudgetRow, FocusOperator, MeasurementMethod, TargetPattern, TargetPolarity } from '../measure/types';

/**
 * The engine's result. The fields named in the manifest contract are always
 * present; everything else is a Paraxia extension (optional by contract) that
 * the app uses to draw plots and the certificate.
 */

export type FrameRejectionReason = 'undecodable' | 'saturated' | 'target-lost' | 'outlier' | 'excluded';

export interface FrameRejection {
  file: string;
  reason: FrameRejectionReason;
  detail?: string;
}

export interface FrameOverlay {
  pattern: TargetPattern;
  /** Region analysed, in full-frame pixels. */
  regionPx: { x: number; y: number; width: number; height: number };
  /** Dot centres (dot-pair) or square corners, in full-frame pixels. */
  pointsPx: { x: number; y: number }[];
  /** Approximate dot radius in pixels (dot-pair only). */
  radiusPx?: number;
}

export interface FrameAnalysis {
  file: string;
  positionMm: number;
  status: 'used' | 'rejected';
  reason?: FrameRejectionReason;
  /** Normalised focus measure of the chosen operator. */
  focusValue: number | null;
  focusValues?: Partial<Record<FocusOperator, number>>;
  sizePx: number | null;
  mtf50CyclesPerPixel: number | null;
  saturatedFraction: number | null;
  meanLevel: number | null;
  overlay: FrameOverlay | null;
  /** Residual from the fitted focus curve (focus units), when the frame was in the fit window. */
  focusResidual: number | null;
}

export interface FocusPeakFit {
  bestFocusPositionMm: number;
  standardUncertaintyMm: number;
  degreesOfFreedom: number;
  modelName: string;
  parameters: Record<string, number>;
  widthMm: number;
  /** The fitted model sampled across the fitted window, for plotting. */
  curve: { positionMm: number; value: number }[];
}

export interface SizeThroughFocusFit {
  slopePxPerMm: number;
  interceptPx: number;
  sizeAtBestFocusPx: number;
  sizeAtBestFocusStandardUncertaintyPx: number;
  degreesOfFreedom: number;
  positionsMm: [number, number];
}

export interface SweepResult {
  bestFocusPositionMm?: number;
  bestFocusStandardUncertaintyMm?: number;
  /** Displacement sweeps: the two sharp lens positions. */
  bestFocusPositionsMm?: [number, number];
  bestFocusStandardUncertaintiesMm?: [number, number];
  magnification: number | null;
  /** Displacement sweeps: magnification at each sharp position. */
  magnifications?: [number, number];
  framesUsed: number;
  framesRejected: FrameRejection[];
  /* extensions */
  moving?: 'sensor' | 'lens';
  objectPositionMm?: number;
  lensPositionMm?: number;
  sensorPositionMm?: number;
  imageSizeMm?: number | null;
  imageSizeStandardUncertaintyMm?: number | null;
  polarity?: TargetPolarity;
  focusOperator?: FocusOperator;
  focusFits?: FocusPeakFit[];
  sizeFits?: SizeThroughFocusFit[];
  frames?: FrameAnalysis[];
}

export interface ConformityResult {
  decision: 'conforms' | 'does-not-conform' | 'undecided';
  rule: 'simple' | 'guarded';
  lowerLimitMm: number;
  upperLimitMm: number;
  statement: string;
}

export interface MeasurementResult {
  method: MeasurementMethod;
  focalLengthMm: number;
  standardUncertaintyMm: number;
  expandedUncertaintyMm: number;
  coverageFactor: number;
  sweeps: SweepResult[];
  principalPlanes?: {
    frontOffsetMm: number;
    rearOffsetMm: number;
    frontOffsetStandardUncertaintyMm?: number;
    rearOffsetStandardUncertaintyMm?: number;
  };
  backFocalDistanceMm?: number;
  backFocalDistanceStandardUncertaintyMm?: number;
  uncertaintyBudget: (BudgetRow & { standardUncertaintyMm: number })[];
  warnings: string[];
  /* extensions */
  opticalPowerDioptres?: number;
  opticalPowerExpandedUncertaintyDioptres?: number;
  coverageProbability?: number;
  effectiveDegreesOfFreedom?: number;
  monteCarlo?: {
    draws: number;
    focalLengthMm: number;
    standardUncertaintyMm: number;
    intervalLowMm: number;
    intervalHighMm: number;
    /** Scatter of the interval ends between batches (JCGM 101:2008 §7.9.4). */
    endpointStandardDeviationMm: number;
    numericalToleranceMm: number;
    agreesWithGum: boolean;
  };
  /** Intermediate estimates (e.g. from positions and from magnification) with their standard uncertainties. */
  estimates?: { name: string; focalLengthMm: number; standardUncertaintyMm: number }[];
  conformity?: ConformityResult;
  engineVersion?: string;
}
