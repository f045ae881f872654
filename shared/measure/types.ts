/**
 * Types shared by the pure measurement code. No I/O here: images arrive
 * already decoded to luminance by the server side.
 */

/** A decoded luminance image, row-major. Values are in the file's own units
 * (0..255 for 8-bit, 0..65535 for 16-bit); `maxValue` is that full scale. */
export interface GreyImage {
  width: number;
  height: number;
  data: Float32Array;
  maxValue: number;
}

/** An axis-aligned pixel rectangle; x, y are the top-left corner. */
export interface PixelRect {
  x: number;
  y: number;
  width: number;
  height: number;
}

export type TargetPattern = 'dot-pair' | 'square';
export type TargetPolarity = 'dark-on-light' | 'light-on-dark';
export type FocusOperator = 'gradient-energy' | 'laplacian-variance' | 'brenner' | 'normalised-variance';
export type MeasurementMethod =
  | 'finite-conjugate'
  | 'multi-conjugate'
  | 'displacement'
  | 'collimator'
  | 'auxiliary-lens';

/** One row of an uncertainty budget (GUM, JCGM 100:2008). */
export interface BudgetRow {
  source: string;
  value: number;
  unit: string;
  standardUncertainty: number;
  degreesOfFreedom: number;
  sensitivity: number;
  /** |sensitivity| × standardUncertainty, in the output's unit (mm). */
  contributionMm: number;
  /** Share of the combined variance, 0..1. */
  varianceShare: number;
}
