/**
 * Displacement (Bessel's) method: with object and sensor a distance D apart,
 * a lens is sharp at two positions d apart and f = (D² − d²)/(4D). For a thick
 * lens D is first reduced by the principal-plane separation HH′; where the
 * principal planes sit relative to the mark does not matter.
 */
import { InvalidOptionError } from '../fit/invalid-option-error';
import { MethodPreconditionError } from './method-precondition-error';

export { MethodPreconditionError } from './method-precondition-error';

export interface SolveDisplacementOptions {
  objectPositionMm: number;
  sensorPositionMm: number;
  /** The two lens-mark readings at which the image is sharp. */
  lensPositionsMm: [number, number];
  /** Separation of the principal planes, position of H′ minus position of H (default 0, thin lens). */
  principalPlaneSeparationMm?: number;
}

export interface DisplacementSolution {
  focalLengthMm: number;
  /** D, object to sensor, reduced by the principal-plane separation. */
  objectSensorDistanceMm: number;
  /** d, distance between the two sharp lens positions. */
  lensShiftMm: number;
}

export function solveDisplacement(options: SolveDisplacementOptions): DisplacementSolution {
  const { objectPositionMm, sensorPositionMm, lensPositionsMm, principalPlaneSeparationMm = 0 } = options;
  if (!Number.isFinite(objectPositionMm)) throw new InvalidOptionError('Option objectPositionMm must be a finite number.');
  if (!Number.isFinite(sensorPositionMm)) throw new InvalidOptionError('Option sensorPositionMm must be a finite number.');
  if (!Array.isArray(lensPositionsMm) || lensPositionsMm.length !== 2 || !lensPositionsMm.every(Number.isFinite)) {
    throw new InvalidOptionError('Option lensPositionsMm must hold the two sharp lens positions as finite numbers.');
  }
  if (!Number.isFinite(principalPlaneSeparationMm)) throw new InvalidOptionError('Option principalPlaneSeparationMm must be a finite number.');
  const objectSensorDistanceMm = sensorPositionMm - objectPositionMm - principalPlaneSeparationMm;
  const lensShiftMm = Math.abs(lensPositionsMm[1] - lensPositionsMm[0]);
  if (!(objectSensorDistanceMm > 0)) {
    throw new MethodPreconditionError(
      `The displacement method needs the sensor beyond the object: object-to-sensor distance ${objectSensorDistanceMm.toFixed(3)} mm is not positive.`,
    );
  }
  if (!(lensShiftMm < objectSensorDistanceMm)) {
    throw new MethodPreconditionError(
      `The two sharp lens positions are ${lensShiftMm.toFixed(3)} mm apart, not less than the object-to-sensor distance ${objectSensorDistanceMm.toFixed(3)} mm, so D > 4f cannot hold.`,
    );
  }
  const lensesOutsideGap = lensPositionsMm.some((p) => p <= objectPositionMm || p >= sensorPositionMm);
  if (lensesOutsideGap) {
    throw new MethodPreconditionError('Both sharp lens positions must lie between the object and the sensor.');
  }
  return {
    focalLengthMm: (objectSensorDistanceMm ** 2 - lensShiftMm ** 2) / (4 * objectSensorDistanceMm),
    objectSensorDistanceMm,
    lensShiftMm,
  };
}
