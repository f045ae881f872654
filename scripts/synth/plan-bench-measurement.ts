import type { BadFrameKind, BenchFrameTruth, BenchScenario, BenchSweepTruth, BenchTruth } from './bench-scenario';
import { checkBenchScenarioOptions, type ResolvedBenchScenario } from './check-bench-scenario-options';
import { FRAME_EXTENSIONS } from './encode-frame';
import { imagingFocalLengthMm, solveSweepFocus } from './paraxial-bench';
import { benchFrameGeometry, opticalAxisPx } from './render-bench-frame';
import { createSeededRandom } from './seeded-random';

/** Stream purposes, so that each random draw has its own reproducible stream. */
export const RANDOM_PURPOSE = { sweepOffset: 1, exposureGain: 2, sensorNoise: 3, spoiledBytes: 4 } as const;

export interface PlannedFrame {
  sweepIndex: number;
  frameIndex: number;
  file: string;
  positionMm: number;
  exposureGain: number;
  badFrame: BadFrameKind | null;
}

export interface BenchPlan {
  scenario: ResolvedBenchScenario;
  frames: PlannedFrame[];
  /** The measurement.json contents (measurement-manifest.md). */
  manifest: Record<string, unknown>;
  truth: BenchTruth;
}

const READING_DECIMALS = 1000;

/**
 * Everything about a bench measurement except the pixels: true focus of
 * every sweep, the rail readings of every frame (around focus, shifted by a
 * fraction of a step), per-frame lamp flicker, file names, manifest and truth.
 * Checks that the blurred target stays on the sensor in every frame.
 */
export function planBenchMeasurement(input: BenchScenario): BenchPlan {
  const scenario = checkBenchScenarioOptions(input);
  const { camera, target } = scenario;
  const extension = FRAME_EXTENSIONS[camera.format];
  const frames: PlannedFrame[] = [];
  const sweepTruths: BenchSweepTruth[] = [];
  const badFrames: BenchTruth['badFrames'] = [];

  scenario.sweeps.forEach((sweep, sweepIndex) => {
    const focus = solveSweepFocus({ scenario, sweepIndex });
    let positionsMm: number[];
    if (sweep.positionsMm) {
      positionsMm = sweep.positionsMm;
    } else {
      positionsMm = focus.flatMap((truth, focusIndex) => {
        const offsetSteps =
          sweep.offsetSteps ?? createSeededRandom(scenario.seed, sweepIndex, focusIndex, RANDOM_PURPOSE.sweepOffset).uniform() - 0.5;
        const step = sweep.stepsMm[focusIndex];
        return Array.from({ length: sweep.framesPerFocus }, (_, k) => {
          const reading = truth.positionMm + (k - (sweep.framesPerFocus - 1) / 2 + offsetSteps) * step;
          return Math.round(reading * READING_DECIMALS) / READING_DECIMALS;
        });
      });
    }
    const frameTruths: BenchFrameTruth[] = positionsMm.map((positionMm, frameIndex) => {
      const file = `s${sweepIndex + 1}/${String(frameIndex + 1).padStart(4, '0')}.${extension}`;
      const bad = scenario.badFrames.find((b) => b.sweepNumber === sweepIndex + 1 && b.frameNumber === frameIndex + 1);
      const flicker = createSeededRandom(scenario.seed, sweepIndex, frameIndex, RANDOM_PURPOSE.exposureGain).uniform() * 2 - 1;
      const exposureGain = (1 + camera.exposureFlickerFraction * flicker) * (bad?.kind === 'saturated' ? 8 : 1);
      const geometry = benchFrameGeometry({ scenario, sweepIndex, positionMm });
      const box = geometry.blurredTargetBoundsPx;
      if (box.x < 0 || box.y < 0 || box.x + box.width > camera.widthPx || box.y + box.height > camera.heightPx) {
        throw new Error(
          `sweeps[${sweepIndex}] frame ${frameIndex + 1} at ${positionMm} mm: the blurred target image (x ${box.x}…${box.x + box.width}, y ${box.y}…${box.y + box.height} px) leaves the ${camera.widthPx}×${camera.heightPx} px frame; use a smaller target, a larger frame or a shorter sweep.`,
        );
      }
      frames.push({ sweepIndex, frameIndex, file, positionMm, exposureGain, badFrame: bad?.kind ?? null });
      if (bad) badFrames.push({ file, kind: bad.kind });
      return {
        file,
        positionMm,
        defocusMm: geometry.optics.defocusMm,
        blurDiameterPx: geometry.blurDiameterPx,
        imageSizeOnSensorMm: geometry.imageSizeOnSensorMm,
        exposureGain,
        ...(bad ? { badFrame: bad.kind } : {}),
      };
    });
    for (const bad of scenario.badFrames) {
      if (bad.sweepNumber === sweepIndex + 1 && bad.frameNumber > positionsMm.length) {
        throw new Error(`A bad frame was asked for at frame ${bad.frameNumber} of sweep ${bad.sweepNumber}, which has only ${positionsMm.length} frames.`);
      }
    }
    const lensMoves = scenario.method === 'displacement';
    sweepTruths.push({
      moving: lensMoves ? 'lens' : 'sensor',
      objectPositionMm: sweep.objectPositionMm,
      lensPositionMm: sweep.lensPositionMm,
      sensorPositionMm: sweep.sensorPositionMm,
      bestFocusPositionMm: lensMoves ? null : focus[0].positionMm,
      sharpLensPositionsMm: lensMoves && focus.length === 2 ? [focus[0].positionMm, focus[1].positionMm] : null,
      focus,
      frames: frameTruths,
    });
  });

  const truth: BenchTruth = {
    method: scenario.method,
    seed: scenario.seed,
    focalLengthMm: scenario.lens.focalLengthMm,
    frontOffsetMm: scenario.lens.frontOffsetMm,
    rearOffsetMm: scenario.lens.rearOffsetMm,
    fNumber: scenario.lens.fNumber,
    exitPupilOffsetMm: scenario.lens.exitPupilOffsetMm,
    combinedFocalLengthMm: scenario.method === 'auxiliary-lens' ? imagingFocalLengthMm(scenario) : null,
    auxiliaryFocalLengthMm: scenario.auxiliaryLens?.focalLengthMm ?? null,
    collimatorFocalLengthMm: scenario.collimator?.focalLengthMm ?? null,
    backFocalDistanceMm: scenario.method === 'collimator' ? scenario.lens.rearOffsetMm + scenario.lens.focalLengthMm : null,
    pattern: target.pattern,
    polarity: target.polarity,
    targetSizeMm: target.sizeMm,
    pixelPitchUm: camera.pixelPitchUm,
    opticalAxisPx: opticalAxisPx(scenario),
    imageInverted: true,
    sweeps: sweepTruths,
    badFrames,
  };

  const manifest: Record<string, unknown> = {
    method: scenario.method,
    camera: { pixelPitchUm: camera.pixelPitchUm, pixelPitchUncertaintyUm: camera.pixelPitchUncertaintyUm },
    target: {
      pattern: target.pattern,
      sizeMm: target.sizeMm,
      sizeUncertaintyMm: target.sizeUncertaintyMm,
      ...(target.declarePolarity ? { polarity: target.polarity } : {}),
    },
    scale: { uncertaintyMm: scenario.scaleUncertaintyMm },
    ...(scenario.collimator ? { collimator: scenario.collimator } : {}),
    ...(scenario.auxiliaryLens ? { auxiliaryLens: scenario.auxiliaryLens } : {}),
    sweeps: scenario.sweeps.map((sweep, sweepIndex) => ({
      moving: scenario.method === 'displacement' ? 'lens' : 'sensor',
      ...(sweep.objectPositionMm !== null ? { objectPositionMm: sweep.objectPositionMm } : {}),
      ...(sweep.lensPositionMm !== null ? { lensPositionMm: sweep.lensPositionMm } : {}),
      ...(sweep.sensorPositionMm !== null ? { sensorPositionMm: sweep.sensorPositionMm } : {}),
      frames: frames.filter((f) => f.sweepIndex === sweepIndex).map((f) => ({ file: f.file, positionMm: f.positionMm })),
    })),
  };

  return { scenario, frames, manifest, truth };
}
