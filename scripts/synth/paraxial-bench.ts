import type { BenchFocusTruth } from './bench-scenario';
import type { ResolvedBenchScenario } from './check-bench-scenario-options';

/**
 * Paraxial optics of the simulated bench (methods.md §1). One rail axis z in
 * mm, increasing with the light. Front and rear principal planes sit at
 * H = mark + h and H′ = mark + h′; Gaussian lens equation 1/a + 1/b = 1/f
 * with a = H − object and b = image − H′; |m| = b/a.
 */

/** The focal length that forms the image: the lens, or for auxiliary-lens the pair in contact. */
export function imagingFocalLengthMm(scenario: ResolvedBenchScenario): number {
  if (scenario.method === 'auxiliary-lens') {
    // Thin lenses in contact: powers add, 1/f_pair = 1/f_x + 1/f_aux (paraxial optics, from memory).
    const pairPower = 1 / scenario.lens.focalLengthMm + 1 / scenario.auxiliaryLens!.focalLengthMm;
    if (pairPower <= 0) {
      throw new Error(
        `auxiliaryLens.focalLengthMm (${scenario.auxiliaryLens!.focalLengthMm}) is too weak to make the pair with lens.focalLengthMm (${scenario.lens.focalLengthMm}) converge: no real image forms.`,
      );
    }
    return 1 / pairPower;
  }
  return scenario.lens.focalLengthMm;
}

export interface ImageFormation {
  imagePlaneMm: number;
  /** a; null for an object at infinity. */
  objectDistanceMm: number | null;
  imageDistanceMm: number;
  /** |image / object| in the image plane (collimator: f / f_c). */
  magnification: number;
  exitPupilPositionMm: number;
}

/** Where the lens (mark at lensMarkMm) images the target, or null when no real image forms (a ≤ f). */
export function formImage(options: { scenario: ResolvedBenchScenario; lensMarkMm: number; objectPositionMm: number | null }): ImageFormation | null {
  const { scenario, lensMarkMm, objectPositionMm } = options;
  const f = imagingFocalLengthMm(scenario);
  const frontPlaneMm = lensMarkMm + scenario.lens.frontOffsetMm;
  const rearPlaneMm = lensMarkMm + scenario.lens.rearOffsetMm;
  const exitPupilPositionMm = rearPlaneMm + scenario.lens.exitPupilOffsetMm;
  if (objectPositionMm === null) {
    // Object at the collimator's focal plane: parallel bundles at θ = atan(y/f_c)
    // focus in the rear focal plane at height f·tanθ = f·y/f_c (paraxial optics, from memory).
    const fc = scenario.collimator!.focalLengthMm;
    return { imagePlaneMm: rearPlaneMm + f, objectDistanceMm: null, imageDistanceMm: f, magnification: f / fc, exitPupilPositionMm };
  }
  const a = frontPlaneMm - objectPositionMm;
  if (a <= f) return null;
  const b = (a * f) / (a - f);
  return { imagePlaneMm: rearPlaneMm + b, objectDistanceMm: a, imageDistanceMm: b, magnification: b / a, exitPupilPositionMm };
}

export interface SensorOptics {
  imagePlaneMm: number;
  exitPupilPositionMm: number;
  /** Sensor − image plane. */
  defocusMm: number;
  /** |m| in the image plane. */
  magnification: number;
  /** Target-to-sensor scale: |m|·(z − z_p)/(z_img − z_p), chief rays through the exit pupil centre. */
  sensorScale: number;
  /** Geometric blur disc D_p·|z − z_img|/(z_img − z_p), by similar triangles. */
  blurDiameterMm: number;
  /** Sensor − exit pupil, for the field angle of vignetting. */
  pupilToSensorMm: number;
}

/** The optics a sensor at sensorMm sees with the lens mark at lensMarkMm. */
export function sensorOptics(options: {
  scenario: ResolvedBenchScenario;
  lensMarkMm: number;
  objectPositionMm: number | null;
  sensorMm: number;
}): SensorOptics {
  const { scenario, lensMarkMm, objectPositionMm, sensorMm } = options;
  const image = formImage({ scenario, lensMarkMm, objectPositionMm });
  if (!image) {
    throw new Error(
      `The lens at ${lensMarkMm.toFixed(3)} mm forms no real image of the target at ${objectPositionMm} mm (object inside the focal length).`,
    );
  }
  const pupilToImageMm = image.imagePlaneMm - image.exitPupilPositionMm;
  if (pupilToImageMm <= 0) {
    throw new Error(`lens.exitPupilOffsetMm (${scenario.lens.exitPupilOffsetMm}) puts the exit pupil at or behind the image plane.`);
  }
  const pupilToSensorMm = sensorMm - image.exitPupilPositionMm;
  if (pupilToSensorMm <= 0) {
    throw new Error(`The sensor at ${sensorMm.toFixed(3)} mm lies in front of the exit pupil at ${image.exitPupilPositionMm.toFixed(3)} mm.`);
  }
  const pupilDiameterMm = Math.abs(imagingFocalLengthMm(scenario)) / scenario.lens.fNumber;
  const defocusMm = sensorMm - image.imagePlaneMm;
  return {
    imagePlaneMm: image.imagePlaneMm,
    exitPupilPositionMm: image.exitPupilPositionMm,
    defocusMm,
    magnification: image.magnification,
    // Similar triangles from the exit pupil centre (methods.md §1; paraxial optics, from memory).
    sensorScale: (image.magnification * pupilToSensorMm) / pupilToImageMm,
    blurDiameterMm: (pupilDiameterMm * Math.abs(defocusMm)) / pupilToImageMm,
    pupilToSensorMm,
  };
}

function focusTruth(scenario: ResolvedBenchScenario, lensMarkMm: number, objectPositionMm: number | null, positionMm: number): BenchFocusTruth {
  const image = formImage({ scenario, lensMarkMm, objectPositionMm })!;
  return {
    positionMm,
    imagePlaneMm: image.imagePlaneMm,
    lensMarkMm,
    objectDistanceMm: image.objectDistanceMm,
    imageDistanceMm: image.imageDistanceMm,
    magnification: image.magnification,
    imageSizeMm: image.magnification * scenario.target.sizeMm,
    exitPupilPositionMm: image.exitPupilPositionMm,
  };
}

/**
 * The true sharp condition(s) of a sweep: one image plane for a moving sensor;
 * for displacement, the two lens positions that image the target on the fixed
 * sensor, nearer-object first. Throws a sentence naming the sweep when no
 * real image can form.
 */
export function solveSweepFocus(options: { scenario: ResolvedBenchScenario; sweepIndex: number }): BenchFocusTruth[] {
  const { scenario, sweepIndex } = options;
  const sweep = scenario.sweeps[sweepIndex];
  const name = `sweeps[${sweepIndex}]`;
  const f = imagingFocalLengthMm(scenario);
  if (scenario.method !== 'displacement') {
    const lensMarkMm = sweep.lensPositionMm!;
    const image = formImage({ scenario, lensMarkMm, objectPositionMm: sweep.objectPositionMm });
    if (!image) {
      const a = lensMarkMm + scenario.lens.frontOffsetMm - sweep.objectPositionMm!;
      throw new Error(`${name}.objectPositionMm puts the target ${a.toFixed(3)} mm from the front principal plane, not beyond the focal length ${f.toFixed(3)} mm: no real image forms.`);
    }
    return [focusTruth(scenario, lensMarkMm, sweep.objectPositionMm, image.imagePlaneMm)];
  }
  // Lens moves between fixed object and sensor: a + b = D − (h′ − h) = D′, and
  // a² − D′a + D′f = 0 gives the two conjugate lens positions (Bessel; paraxial optics, from memory).
  const objectMm = sweep.objectPositionMm!;
  const distanceMm = sweep.sensorPositionMm! - objectMm;
  const effectiveMm = distanceMm - (scenario.lens.rearOffsetMm - scenario.lens.frontOffsetMm);
  const discriminant = effectiveMm * effectiveMm - 4 * effectiveMm * f;
  if (!(effectiveMm > 0) || discriminant <= 0) {
    // With D ≤ 4f the image never forms on the sensor. Explicit readings may still
    // be rendered (every frame blurred): a bench set up wrongly, for rejection tests.
    if (sweep.positionsMm) return [];
    throw new Error(
      `${name}: the object–sensor distance ${distanceMm.toFixed(3)} mm must exceed 4f = ${(4 * f).toFixed(3)} mm (plus the principal-plane separation) for two sharp lens positions.`,
    );
  }
  const root = Math.sqrt(discriminant);
  return [(effectiveMm - root) / 2, (effectiveMm + root) / 2].map((a) => {
    const lensMarkMm = objectMm + a - scenario.lens.frontOffsetMm;
    return focusTruth(scenario, lensMarkMm, objectMm, lensMarkMm);
  });
}
