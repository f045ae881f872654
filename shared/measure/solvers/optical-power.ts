import { InvalidOptionError } from '../fit/invalid-option-error';

/** Optical power in dioptres (1/m) of a focal length in mm: P = 1000 / f. */
export function opticalPowerDioptres(focalLengthMm: number): number {
  if (!Number.isFinite(focalLengthMm) || focalLengthMm === 0) {
    throw new InvalidOptionError('Option focalLengthMm must be a finite, non-zero number.');
  }
  return 1000 / focalLengthMm;
}
