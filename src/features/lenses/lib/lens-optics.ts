/**
 * The optics a lens form and a lens page need, checked for the values a
 * person can type: power ↔ focal length in air (P = 1000 / f′, P in
 * dioptres, f′ in mm), the lens's kind from the sign of f′, and its
 * tolerance band. The formulas are the shared ones the server uses
 * (@shared/schemas/lenses), so the page and the API never disagree.
 */
import {
  focalLengthMmFromPowerDioptres,
  lensKindOf as sharedLensKindOf,
  powerDioptresFromFocalLengthMm,
  toleranceBandOf,
  type LensKind,
} from '@shared/schemas/lenses';

function checkNonZeroFinite(value: number, name: string): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || value === 0) {
    throw new RangeError(`Option "${name}" must be a finite, non-zero number; got ${value}.`);
  }
}

/** Optical power in dioptres of a focal length in millimetres. */
export function powerFromFocalLengthDioptres(focalLengthMm: number): number {
  checkNonZeroFinite(focalLengthMm, 'focalLengthMm');
  return powerDioptresFromFocalLengthMm(focalLengthMm);
}

/** Focal length in millimetres of an optical power in dioptres. */
export function focalLengthFromPowerMm(powerDioptres: number): number {
  checkNonZeroFinite(powerDioptres, 'powerDioptres');
  return focalLengthMmFromPowerDioptres(powerDioptres);
}

/** A positive focal length converges light, a negative one diverges it. */
export function lensKindOf(nominalFocalLengthMm: number): LensKind {
  checkNonZeroFinite(nominalFocalLengthMm, 'nominalFocalLengthMm');
  return sharedLensKindOf(nominalFocalLengthMm);
}

export interface ToleranceBandOptions {
  nominalFocalLengthMm: number;
  /** ± percent of |f′|. */
  tolerancePercent?: number | null;
  /** ± millimetres. */
  toleranceMm?: number | null;
}

export interface ToleranceBand {
  lowerLimitMm: number;
  upperLimitMm: number;
  halfWidthMm: number;
  /** Which recorded tolerance sets the band (the narrower one when both are given). */
  from: 'percent' | 'mm';
}

export function checkToleranceBandOptions(options: ToleranceBandOptions): Required<ToleranceBandOptions> {
  const { nominalFocalLengthMm, tolerancePercent = null, toleranceMm = null } = options;
  checkNonZeroFinite(nominalFocalLengthMm, 'nominalFocalLengthMm');
  if (tolerancePercent === null && toleranceMm === null) {
    throw new RangeError('Give at least one of the options "tolerancePercent" and "toleranceMm".');
  }
  if (tolerancePercent !== null && !(Number.isFinite(tolerancePercent) && tolerancePercent > 0)) {
    throw new RangeError(`Option "tolerancePercent" must be a positive number; got ${tolerancePercent}.`);
  }
  if (toleranceMm !== null && !(Number.isFinite(toleranceMm) && toleranceMm > 0)) {
    throw new RangeError(`Option "toleranceMm" must be a positive number; got ${toleranceMm}.`);
  }
  return { nominalFocalLengthMm, tolerancePercent, toleranceMm };
}

/** The band f′ ± t around the nominal; when both tolerances are recorded the lens must meet both, so the narrower applies. */
export function toleranceBand(options: ToleranceBandOptions): ToleranceBand {
  const checked = checkToleranceBandOptions(options);
  const band = toleranceBandOf(checked);
  const fromPercent = checked.tolerancePercent === null ? Infinity : (Math.abs(checked.nominalFocalLengthMm) * checked.tolerancePercent) / 100;
  return { ...band, from: fromPercent <= band.halfWidthMm ? 'percent' : 'mm' };
}
