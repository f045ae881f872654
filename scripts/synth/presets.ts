import type { BenchCamera, BenchScenario } from './bench-scenario';

/**
 * Realistic bench scenarios of an invented lab. Every preset has the optical
 * axis off the frame centre, a target slightly off axis, shot and read
 * noise, vignetting and lamp flicker on. Focal lengths are deliberately not
 * round: a stock lens is rarely exactly its marked value.
 */

const camera: BenchCamera = {
  pixelPitchUm: 3.45,
  pixelPitchUncertaintyUm: 0.01,
  widthPx: 1600,
  heightPx: 1200,
  format: 'png8',
  opticalAxisOffsetPx: { x: 37, y: -22 },
  fullWellElectrons: 20_000,
  readNoiseElectrons: 5,
  exposureLevel: 0.65,
  exposureFlickerFraction: 0.05,
  noise: true,
  vignetting: { naturalCos4: true, radialFalloffAtCorner: 0.12 },
  psfFloorSigmaPx: 0.6,
};

export type BenchPresetName =
  | 'finite-conjugate'
  | 'multi-conjugate'
  | 'displacement'
  | 'collimator'
  | 'auxiliary-lens'
  | 'square-target'
  | 'light-on-dark'
  | 'large';

const finiteConjugate: BenchScenario = {
  method: 'finite-conjugate',
  seed: 1,
  lens: { focalLengthMm: 101.3, frontOffsetMm: 0, rearOffsetMm: 0, fNumber: 8 },
  camera,
  target: { pattern: 'dot-pair', sizeMm: 6, sizeUncertaintyMm: 0.002, dotDiameterMm: 1.2, centreOffsetMm: { x: 0.4, y: -0.3 } },
  scaleUncertaintyMm: 0.02,
  sweeps: [{ objectPositionMm: 0, lensPositionMm: 300, framesPerFocus: 25, stepMm: 0.25 }],
};

export const benchPresets: Record<BenchPresetName, BenchScenario> = {
  'finite-conjugate': finiteConjugate,

  'multi-conjugate': {
    method: 'multi-conjugate',
    seed: 2,
    lens: { focalLengthMm: 99.2, frontOffsetMm: 2.5, rearOffsetMm: -1.5, fNumber: 8, exitPupilOffsetMm: 1.2 },
    camera: { ...camera, format: 'png16' },
    target: { pattern: 'dot-pair', sizeMm: 6, dotDiameterMm: 1.0, centreOffsetMm: { x: 0.25, y: 0.35 } },
    sweeps: [
      // Object distances a ≈ 450, 330 and 260 mm from the front principal plane (lens mark at 500 mm).
      { objectPositionMm: 52.5, lensPositionMm: 500, framesPerFocus: 25, stepMm: 0.3 },
      { objectPositionMm: 172.5, lensPositionMm: 500, framesPerFocus: 25, stepMm: 0.25 },
      { objectPositionMm: 242.5, lensPositionMm: 500, framesPerFocus: 25, stepMm: 0.25 },
    ],
  },

  displacement: {
    method: 'displacement',
    seed: 3,
    lens: { focalLengthMm: 99.6, frontOffsetMm: 0, rearOffsetMm: 0, fNumber: 8 },
    camera,
    // |m| ≈ 2.0 and 0.5 at the two sharp positions: a small target keeps the large image on the sensor.
    target: { pattern: 'dot-pair', sizeMm: 1.6, dotDiameterMm: 0.35, centreOffsetMm: { x: 0.05, y: -0.04 } },
    // D = 450 mm > 4f; lens steps chosen so both groups span a similar blur range
    // (the image moves about (1 − m²) times as fast as the lens).
    sweeps: [{ objectPositionMm: 0, sensorPositionMm: 450, framesPerFocus: 25, stepMm: [0.15, 0.3] }],
  },

  collimator: {
    method: 'collimator',
    seed: 4,
    lens: { focalLengthMm: 99.8, frontOffsetMm: 2.5, rearOffsetMm: -1.5, fNumber: 8 },
    camera: { ...camera, format: 'jpeg', jpegQuality: 92 },
    target: { pattern: 'dot-pair', sizeMm: 8, dotDiameterMm: 2, centreOffsetMm: { x: -0.6, y: 0.5 } },
    collimator: { focalLengthMm: 500, focalLengthUncertaintyMm: 0.5 },
    sweeps: [{ lensPositionMm: 600, framesPerFocus: 25, stepMm: 0.2 }],
  },

  'auxiliary-lens': {
    method: 'auxiliary-lens',
    seed: 5,
    // The unknown diverging lens; with the +75 mm auxiliary in contact the pair has f ≈ +151 mm.
    lens: { focalLengthMm: -148.7, frontOffsetMm: 0, rearOffsetMm: 0, fNumber: 8 },
    camera,
    target: { pattern: 'dot-pair', sizeMm: 6, dotDiameterMm: 1.2, centreOffsetMm: { x: 0.3, y: 0.2 } },
    auxiliaryLens: { focalLengthMm: 75, focalLengthUncertaintyMm: 0.1 },
    sweeps: [{ objectPositionMm: 0, lensPositionMm: 450, framesPerFocus: 25, stepMm: 0.25 }],
  },

  'square-target': {
    ...finiteConjugate,
    seed: 6,
    camera: { ...camera, format: 'png16' },
    target: { pattern: 'square', sizeMm: 4, rotationDeg: 4, centreOffsetMm: { x: 0.4, y: -0.3 } },
  },

  'light-on-dark': {
    ...finiteConjugate,
    seed: 7,
    camera: { ...camera, format: 'tiff16' },
    target: { ...finiteConjugate.target, polarity: 'light-on-dark', darkRelativeIrradiance: 0.04, declarePolarity: false },
  },

  /** The benchmark's frame: 4000 × 3000 JPEG of the finite-conjugate bench. */
  large: {
    ...finiteConjugate,
    seed: 8,
    camera: { ...camera, widthPx: 4000, heightPx: 3000, format: 'jpeg', jpegQuality: 90, opticalAxisOffsetPx: { x: 85, y: -60 } },
  },
};

export const benchPresetNames = Object.keys(benchPresets) as BenchPresetName[];
