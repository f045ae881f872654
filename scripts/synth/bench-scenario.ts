import type { MeasurementMethod, TargetPattern, TargetPolarity } from '../../shared/measure/types';

/** How a frame is written. The bit depth follows from the format. */
export type FrameFormat = 'png8' | 'png16' | 'jpeg' | 'tiff16';

/** Deliberately spoiled frames, to exercise rejection. */
export type BadFrameKind = 'saturated' | 'target-lost' | 'pure-noise' | 'truncated' | 'undecodable';

export interface BenchLens {
  /** Focal length of the lens under test (auxiliary-lens: the unknown, usually diverging, lens). */
  focalLengthMm: number;
  /** h: front principal plane H = mark + h. Default 0 (thin lens). */
  frontOffsetMm?: number;
  /** h′: rear principal plane H′ = mark + h′. Default 0 (thin lens). */
  rearOffsetMm?: number;
  /** Working f-number N; the exit pupil diameter is f/N (f of the pair for auxiliary-lens). Default 8. */
  fNumber?: number;
  /** Exit pupil position relative to H′ (mm, along the light). Default 0. */
  exitPupilOffsetMm?: number;
}

export interface BenchCamera {
  pixelPitchUm: number;
  /** Written to the manifest only. Default 0.01 µm. */
  pixelPitchUncertaintyUm?: number;
  widthPx: number;
  heightPx: number;
  format: FrameFormat;
  /** JPEG quality 1–100. Default 92. */
  jpegQuality?: number;
  /** Where the optical axis meets the sensor, relative to the frame centre ((width − 1)/2, (height − 1)/2). Default 0, 0. */
  opticalAxisOffsetPx?: { x: number; y: number };
  /** Default 20 000 e⁻. */
  fullWellElectrons?: number;
  /** Default 5 e⁻ rms. */
  readNoiseElectrons?: number;
  /** Share of the full well the bright part of the scene reaches on the axis. Default 0.65. */
  exposureLevel?: number;
  /** Lamp flicker: each frame's exposure is scaled by 1 + u·this, u uniform in [−1, 1]. Default 0.05. */
  exposureFlickerFraction?: number;
  /** Shot and read noise on (default) or off. Quantisation to DN always happens. */
  noise?: boolean;
  vignetting?: {
    /** Natural cos⁴ fall-off with the field angle seen from the exit pupil. Default true. */
    naturalCos4?: boolean;
    /** Extra radial fall-off 1 − k·(r / r_corner)², k given here (share lost at the farthest corner). Default 0.12. */
    radialFalloffAtCorner?: number;
  };
  /**
   * Gaussian floor of the PSF (diffraction and residual aberration), in pixels. Default 0.6: the
   * Airy core is close to a Gaussian of σ ≈ 0.42·λ·N (from memory), 1.85 µm = 0.54 px at
   * λ = 0.55 µm, N = 8 and 3.45 µm pixels, plus a little residual aberration.
   */
  psfFloorSigmaPx?: number;
}

export interface BenchTarget {
  pattern: TargetPattern;
  /** dot-pair: centre-to-centre distance; square: side length. */
  sizeMm: number;
  /** Written to the manifest only. Default 0.002 mm. */
  sizeUncertaintyMm?: number;
  /** dot-pair only. Default a quarter of sizeMm. */
  dotDiameterMm?: number;
  /** Rotation of the pattern in its plane (dot-pair: the line through the dots). Default 0° for dot-pair, 4° for square. */
  rotationDeg?: number;
  /** Default dark-on-light. */
  polarity?: TargetPolarity;
  /** Whether the manifest states the polarity (else the engine must detect it). Default true. */
  declarePolarity?: boolean;
  /** Target centre relative to the optical axis, in the target plane. Default 0, 0. */
  centreOffsetMm?: { x: number; y: number };
  /** Relative irradiance of the dark parts (the light parts are 1). Default 0.06. */
  darkRelativeIrradiance?: number;
}

/**
 * One sweep. Sensor-moving methods give lensPositionMm (and objectPositionMm
 * except collimator); displacement gives objectPositionMm and sensorPositionMm
 * and the lens moves. Frames are placed around the true focus (displacement:
 * around each of the two sharp lens positions) unless positionsMm is given.
 */
export interface BenchSweep {
  objectPositionMm?: number;
  lensPositionMm?: number;
  sensorPositionMm?: number;
  /** Frames around each focus. Default 25. */
  framesPerFocus?: number;
  /** Rail step between frames. Displacement: one step per sharp position, nearer-object first. */
  stepMm?: number | [number, number];
  /** Shift of the sweep from centred-on-focus, in steps, in [−0.5, 0.5]. Default: seeded random. */
  offsetSteps?: number;
  /** Explicit rail readings of the moving part; overrides the placement above. */
  positionsMm?: number[];
}

export interface BadFrameRequest {
  /** 1-based, default 1. */
  sweepNumber?: number;
  /** 1-based, as in the file name. */
  frameNumber: number;
  kind: BadFrameKind;
}

export interface BenchScenario {
  method: MeasurementMethod;
  seed: number;
  lens: BenchLens;
  camera: BenchCamera;
  target: BenchTarget;
  /** Standard uncertainty of one rail reading, for the manifest. Default 0.02 mm. */
  scaleUncertaintyMm?: number;
  /** collimator only. */
  collimator?: { focalLengthMm: number; focalLengthUncertaintyMm?: number };
  /** auxiliary-lens only: the known converging lens in contact with the lens under test. */
  auxiliaryLens?: { focalLengthMm: number; focalLengthUncertaintyMm?: number };
  sweeps: BenchSweep[];
  badFrames?: BadFrameRequest[];
}

/** The truth of one sharp condition of a sweep (one for sensor sweeps, two for displacement). */
export interface BenchFocusTruth {
  /** Sensor sweeps: rail reading of the image plane. Displacement: rail reading of the lens mark when sharp. */
  positionMm: number;
  imagePlaneMm: number;
  lensMarkMm: number;
  /** a = H − object (collimator: null, object at infinity). */
  objectDistanceMm: number | null;
  /** b = image plane − H′. */
  imageDistanceMm: number;
  /** |image size / target size| at best focus (collimator: f / f_c). */
  magnification: number;
  /** Target size (dot-pair centre distance, square side) in the image plane, mm. */
  imageSizeMm: number;
  exitPupilPositionMm: number;
}

export interface BenchFrameTruth {
  file: string;
  positionMm: number;
  /** Sensor − image plane, mm. */
  defocusMm: number;
  /** Geometric blur disc diameter on the sensor. */
  blurDiameterPx: number;
  /** Target size on the sensor for this frame (chief rays through the exit pupil centre), mm. */
  imageSizeOnSensorMm: number;
  exposureGain: number;
  badFrame?: BadFrameKind;
}

export interface BenchSweepTruth {
  moving: 'sensor' | 'lens';
  objectPositionMm: number | null;
  lensPositionMm: number | null;
  sensorPositionMm: number | null;
  /** Sensor sweeps only. */
  bestFocusPositionMm: number | null;
  /** Displacement only: the two sharp lens positions, nearer-object first. */
  sharpLensPositionsMm: [number, number] | null;
  focus: BenchFocusTruth[];
  frames: BenchFrameTruth[];
}

export interface BenchTruth {
  method: MeasurementMethod;
  seed: number;
  /** Of the lens under test (auxiliary-lens: the unknown lens). */
  focalLengthMm: number;
  frontOffsetMm: number;
  rearOffsetMm: number;
  fNumber: number;
  exitPupilOffsetMm: number;
  /** auxiliary-lens: the pair in contact, 1/f = 1/f_x + 1/f_aux. */
  combinedFocalLengthMm: number | null;
  auxiliaryFocalLengthMm: number | null;
  collimatorFocalLengthMm: number | null;
  /** collimator: image plane − lens mark. */
  backFocalDistanceMm: number | null;
  pattern: TargetPattern;
  polarity: TargetPolarity;
  targetSizeMm: number;
  pixelPitchUm: number;
  /** Pixel coordinates (pixel centres at integers) where the optical axis meets the sensor. */
  opticalAxisPx: { x: number; y: number };
  /** The image on the sensor is inverted (rotated 180° about the optical axis). */
  imageInverted: true;
  sweeps: BenchSweepTruth[];
  badFrames: { file: string; kind: BadFrameKind }[];
}
