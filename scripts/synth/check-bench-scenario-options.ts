import type {
  BadFrameKind,
  BenchScenario,
  FrameFormat,
} from './bench-scenario';
import type { MeasurementMethod, TargetPattern, TargetPolarity } from '../../shared/measure/types';

export interface ResolvedBenchSweep {
  objectPositionMm: number | null;
  lensPositionMm: number | null;
  sensorPositionMm: number | null;
  framesPerFocus: number;
  stepsMm: number[];
  offsetSteps: number | null;
  positionsMm: number[] | null;
}

/** A scenario with every default filled in and every option checked. */
export interface ResolvedBenchScenario {
  method: MeasurementMethod;
  seed: number;
  lens: {
    focalLengthMm: number;
    frontOffsetMm: number;
    rearOffsetMm: number;
    fNumber: number;
    exitPupilOffsetMm: number;
  };
  camera: {
    pixelPitchUm: number;
    pixelPitchUncertaintyUm: number;
    widthPx: number;
    heightPx: number;
    format: FrameFormat;
    bitDepth: 8 | 16;
    jpegQuality: number;
    opticalAxisOffsetPx: { x: number; y: number };
    fullWellElectrons: number;
    readNoiseElectrons: number;
    exposureLevel: number;
    exposureFlickerFraction: number;
    noise: boolean;
    naturalCos4: boolean;
    radialFalloffAtCorner: number;
    psfFloorSigmaPx: number;
  };
  target: {
    pattern: TargetPattern;
    sizeMm: number;
    sizeUncertaintyMm: number;
    dotDiameterMm: number;
    rotationDeg: number;
    polarity: TargetPolarity;
    declarePolarity: boolean;
    centreOffsetMm: { x: number; y: number };
    darkRelativeIrradiance: number;
  };
  scaleUncertaintyMm: number;
  collimator: { focalLengthMm: number; focalLengthUncertaintyMm: number } | null;
  auxiliaryLens: { focalLengthMm: number; focalLengthUncertaintyMm: number } | null;
  sweeps: ResolvedBenchSweep[];
  badFrames: { sweepNumber: number; frameNumber: number; kind: BadFrameKind }[];
}

const METHODS: MeasurementMethod[] = ['finite-conjugate', 'multi-conjugate', 'displacement', 'collimator', 'auxiliary-lens'];
const FORMATS: FrameFormat[] = ['png8', 'png16', 'jpeg', 'tiff16'];
const BAD_KINDS: BadFrameKind[] = ['saturated', 'target-lost', 'pure-noise', 'truncated', 'undecodable'];

function fail(message: string): never {
  throw new Error(message);
}

function finite(value: unknown, name: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) fail(`${name} must be a finite number, got ${String(value)}.`);
  return value;
}

function positive(value: unknown, name: string): number {
  const n = finite(value, name);
  if (n <= 0) fail(`${name} must be greater than 0, got ${n}.`);
  return n;
}

function optionalFinite(value: unknown, fallback: number, name: string): number {
  return value === undefined ? fallback : finite(value, name);
}

function optionalPositive(value: unknown, fallback: number, name: string): number {
  return value === undefined ? fallback : positive(value, name);
}

function inRange(value: number, min: number, max: number, name: string): number {
  if (value < min || value > max) fail(`${name} must lie between ${min} and ${max}, got ${value}.`);
  return value;
}

function positiveInteger(value: unknown, name: string): number {
  const n = finite(value, name);
  if (!Number.isInteger(n) || n < 1) fail(`${name} must be a whole number of at least 1, got ${n}.`);
  return n;
}

/**
 * Fills the defaults of a bench scenario and checks every option, throwing a
 * sentence that names the bad option. Geometry that cannot form an image
 * (object inside the focal length, D ≤ 4f) is checked later, where the
 * conjugates are solved.
 */
export function checkBenchScenarioOptions(scenario: BenchScenario): ResolvedBenchScenario {
  if (!scenario || typeof scenario !== 'object') fail('The bench scenario must be an object.');
  if (!METHODS.includes(scenario.method)) fail(`method must be one of ${METHODS.join(', ')}, got ${String(scenario.method)}.`);
  const method = scenario.method;
  const seed = finite(scenario.seed, 'seed');
  if (!Number.isInteger(seed)) fail(`seed must be a whole number, got ${seed}.`);

  const lensIn = scenario.lens ?? fail('lens is required.');
  const lens = {
    focalLengthMm: finite(lensIn.focalLengthMm, 'lens.focalLengthMm'),
    frontOffsetMm: optionalFinite(lensIn.frontOffsetMm, 0, 'lens.frontOffsetMm'),
    rearOffsetMm: optionalFinite(lensIn.rearOffsetMm, 0, 'lens.rearOffsetMm'),
    fNumber: optionalPositive(lensIn.fNumber, 8, 'lens.fNumber'),
    exitPupilOffsetMm: optionalFinite(lensIn.exitPupilOffsetMm, 0, 'lens.exitPupilOffsetMm'),
  };
  if (lens.focalLengthMm === 0) fail('lens.focalLengthMm must not be 0.');
  if (method !== 'auxiliary-lens' && lens.focalLengthMm < 0) {
    fail(`lens.focalLengthMm must be positive for ${method} (a diverging lens forms no real image; use auxiliary-lens), got ${lens.focalLengthMm}.`);
  }

  const cameraIn = scenario.camera ?? fail('camera is required.');
  if (!FORMATS.includes(cameraIn.format)) fail(`camera.format must be one of ${FORMATS.join(', ')}, got ${String(cameraIn.format)}.`);
  const axisOffset = cameraIn.opticalAxisOffsetPx ?? { x: 0, y: 0 };
  const camera = {
    pixelPitchUm: positive(cameraIn.pixelPitchUm, 'camera.pixelPitchUm'),
    pixelPitchUncertaintyUm: optionalFinite(cameraIn.pixelPitchUncertaintyUm, 0.01, 'camera.pixelPitchUncertaintyUm'),
    widthPx: positiveInteger(cameraIn.widthPx, 'camera.widthPx'),
    heightPx: positiveInteger(cameraIn.heightPx, 'camera.heightPx'),
    format: cameraIn.format,
    bitDepth: (cameraIn.format === 'png16' || cameraIn.format === 'tiff16' ? 16 : 8) as 8 | 16,
    jpegQuality: inRange(optionalFinite(cameraIn.jpegQuality, 92, 'camera.jpegQuality'), 1, 100, 'camera.jpegQuality'),
    opticalAxisOffsetPx: {
      x: finite(axisOffset.x, 'camera.opticalAxisOffsetPx.x'),
      y: finite(axisOffset.y, 'camera.opticalAxisOffsetPx.y'),
    },
    fullWellElectrons: optionalPositive(cameraIn.fullWellElectrons, 20_000, 'camera.fullWellElectrons'),
    readNoiseElectrons: inRange(optionalFinite(cameraIn.readNoiseElectrons, 5, 'camera.readNoiseElectrons'), 0, Infinity, 'camera.readNoiseElectrons'),
    exposureLevel: inRange(optionalFinite(cameraIn.exposureLevel, 0.65, 'camera.exposureLevel'), 0.001, 1, 'camera.exposureLevel'),
    exposureFlickerFraction: inRange(
      optionalFinite(cameraIn.exposureFlickerFraction, 0.05, 'camera.exposureFlickerFraction'),
      0,
      0.5,
      'camera.exposureFlickerFraction',
    ),
    noise: cameraIn.noise ?? true,
    naturalCos4: cameraIn.vignetting?.naturalCos4 ?? true,
    radialFalloffAtCorner: inRange(
      optionalFinite(cameraIn.vignetting?.radialFalloffAtCorner, 0.12, 'camera.vignetting.radialFalloffAtCorner'),
      0,
      0.9,
      'camera.vignetting.radialFalloffAtCorner',
    ),
    psfFloorSigmaPx: inRange(optionalFinite(cameraIn.psfFloorSigmaPx, 0.6, 'camera.psfFloorSigmaPx'), 0, 50, 'camera.psfFloorSigmaPx'),
  };
  if (typeof camera.noise !== 'boolean') fail('camera.noise must be true or false.');
  if (camera.widthPx < 16 || camera.heightPx < 16) fail(`camera.widthPx and camera.heightPx must be at least 16, got ${camera.widthPx}×${camera.heightPx}.`);

  const targetIn = scenario.target ?? fail('target is required.');
  if (targetIn.pattern !== 'dot-pair' && targetIn.pattern !== 'square') {
    fail(`target.pattern must be dot-pair or square, got ${String(targetIn.pattern)}.`);
  }
  const polarity = targetIn.polarity ?? 'dark-on-light';
  if (polarity !== 'dark-on-light' && polarity !== 'light-on-dark') {
    fail(`target.polarity must be dark-on-light or light-on-dark, got ${String(polarity)}.`);
  }
  const sizeMm = positive(targetIn.sizeMm, 'target.sizeMm');
  const centre = targetIn.centreOffsetMm ?? { x: 0, y: 0 };
  const target = {
    pattern: targetIn.pattern,
    sizeMm,
    sizeUncertaintyMm: optionalFinite(targetIn.sizeUncertaintyMm, 0.002, 'target.sizeUncertaintyMm'),
    dotDiameterMm: optionalPositive(targetIn.dotDiameterMm, sizeMm / 4, 'target.dotDiameterMm'),
    rotationDeg: optionalFinite(targetIn.rotationDeg, targetIn.pattern === 'square' ? 4 : 0, 'target.rotationDeg'),
    polarity,
    declarePolarity: targetIn.declarePolarity ?? true,
    centreOffsetMm: { x: finite(centre.x, 'target.centreOffsetMm.x'), y: finite(centre.y, 'target.centreOffsetMm.y') },
    darkRelativeIrradiance: inRange(
      optionalFinite(targetIn.darkRelativeIrradiance, 0.06, 'target.darkRelativeIrradiance'),
      0,
      0.9,
      'target.darkRelativeIrradiance',
    ),
  };
  if (target.pattern === 'dot-pair' && target.dotDiameterMm >= target.sizeMm) {
    fail(`target.dotDiameterMm (${target.dotDiameterMm}) must be smaller than target.sizeMm (${target.sizeMm}) or the dots overlap.`);
  }

  const optionalLensOf = (value: BenchScenario['collimator'], name: string) => {
    if (!value) return null;
    return {
      focalLengthMm: positive(value.focalLengthMm, `${name}.focalLengthMm`),
      focalLengthUncertaintyMm: optionalFinite(value.focalLengthUncertaintyMm, 0, `${name}.focalLengthUncertaintyMm`),
    };
  };
  const collimator = optionalLensOf(scenario.collimator, 'collimator');
  const auxiliaryLens = optionalLensOf(scenario.auxiliaryLens, 'auxiliaryLens');
  if (method === 'collimator' && !collimator) fail('collimator is required for the collimator method.');
  if (method !== 'collimator' && collimator) fail(`collimator is only for the collimator method, not ${method}.`);
  if (method === 'auxiliary-lens' && !auxiliaryLens) fail('auxiliaryLens is required for the auxiliary-lens method.');
  if (method !== 'auxiliary-lens' && auxiliaryLens) fail(`auxiliaryLens is only for the auxiliary-lens method, not ${method}.`);

  if (!Array.isArray(scenario.sweeps) || scenario.sweeps.length === 0) fail('sweeps must hold at least one sweep.');
  if (method === 'multi-conjugate' && scenario.sweeps.length < 2) fail('sweeps must hold at least two sweeps for multi-conjugate.');
  const sweeps = scenario.sweeps.map((sweep, index): ResolvedBenchSweep => {
    const name = `sweeps[${index}]`;
    const lensMoves = method === 'displacement';
    const objectPositionMm = sweep.objectPositionMm === undefined ? null : finite(sweep.objectPositionMm, `${name}.objectPositionMm`);
    const lensPositionMm = sweep.lensPositionMm === undefined ? null : finite(sweep.lensPositionMm, `${name}.lensPositionMm`);
    const sensorPositionMm = sweep.sensorPositionMm === undefined ? null : finite(sweep.sensorPositionMm, `${name}.sensorPositionMm`);
    if (method === 'collimator' && objectPositionMm !== null) fail(`${name}.objectPositionMm must be absent for collimator (the object is at infinity).`);
    if (method !== 'collimator' && objectPositionMm === null) fail(`${name}.objectPositionMm is required for ${method}.`);
    if (lensMoves) {
      if (sensorPositionMm === null) fail(`${name}.sensorPositionMm is required for displacement (the lens moves).`);
      if (lensPositionMm !== null) fail(`${name}.lensPositionMm must be absent for displacement (the lens moves).`);
    } else {
      if (lensPositionMm === null) fail(`${name}.lensPositionMm is required when the sensor moves.`);
      if (sensorPositionMm !== null) fail(`${name}.sensorPositionMm must be absent when the sensor moves.`);
    }
    const framesPerFocus = sweep.framesPerFocus === undefined ? 25 : positiveInteger(sweep.framesPerFocus, `${name}.framesPerFocus`);
    const focusCount = lensMoves ? 2 : 1;
    const stepIn = sweep.stepMm ?? 0.25;
    const stepsMm = (Array.isArray(stepIn) ? stepIn : Array(focusCount).fill(stepIn)).map((step, k) =>
      positive(step, Array.isArray(stepIn) ? `${name}.stepMm[${k}]` : `${name}.stepMm`),
    );
    if (stepsMm.length !== focusCount) fail(`${name}.stepMm must give ${focusCount} step(s) for ${method}, got ${stepsMm.length}.`);
    const offsetSteps =
      sweep.offsetSteps === undefined ? null : inRange(finite(sweep.offsetSteps, `${name}.offsetSteps`), -0.5, 0.5, `${name}.offsetSteps`);
    let positionsMm: number[] | null = null;
    if (sweep.positionsMm !== undefined) {
      if (!Array.isArray(sweep.positionsMm) || sweep.positionsMm.length === 0) fail(`${name}.positionsMm must be a non-empty list of rail readings.`);
      positionsMm = sweep.positionsMm.map((p, k) => finite(p, `${name}.positionsMm[${k}]`));
    }
    return { objectPositionMm, lensPositionMm, sensorPositionMm, framesPerFocus, stepsMm, offsetSteps, positionsMm };
  });

  const badFrames = (scenario.badFrames ?? []).map((bad, index) => {
    const name = `badFrames[${index}]`;
    if (!BAD_KINDS.includes(bad.kind)) fail(`${name}.kind must be one of ${BAD_KINDS.join(', ')}, got ${String(bad.kind)}.`);
    const sweepNumber = bad.sweepNumber === undefined ? 1 : positiveInteger(bad.sweepNumber, `${name}.sweepNumber`);
    if (sweepNumber > sweeps.length) fail(`${name}.sweepNumber is ${sweepNumber} but there are only ${sweeps.length} sweep(s).`);
    return { sweepNumber, frameNumber: positiveInteger(bad.frameNumber, `${name}.frameNumber`), kind: bad.kind };
  });

  return {
    method,
    seed,
    lens,
    camera,
    target,
    scaleUncertaintyMm: optionalFinite(scenario.scaleUncertaintyMm, 0.02, 'scaleUncertaintyMm'),
    collimator,
    auxiliaryLens,
    sweeps,
    badFrames,
  };
}
