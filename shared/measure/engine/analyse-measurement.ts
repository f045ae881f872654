import type { MeasurementManifest } from '../../schemas/measurement-manifest';
import type { FrameAnalysis, MeasurementResult, SweepResult } from '../../schemas/measurement-result';
import type { FocusOperator } from '../types';
import { propagateGum } from '../uncertainty/propagate-gum';
import { monteCarloCrossCheck } from './monte-carlo-cross-check';
import { opticalPowerDioptres } from '../solvers/optical-power';
import { decideConformity, toleranceLimits } from '../conformity/decide-conformity';
import { analyseSweepFrames } from './analyse-sweep-frames';
import { fitSweep, type PeakEstimate } from './fit-sweep';
import { buildMethodModel, type SweepFits } from './method-models';
import type { AnalysisProgress, FrameSource } from './frame-source';

export const ENGINE_VERSION = '1.0.0';

export interface AnalyseMeasurementOptions {
  manifest: MeasurementManifest;
  source: FrameSource;
  /** Frames decoded at once; 2 keeps both cores of a small machine busy. */
  concurrency?: number;
  focusOperator?: FocusOperator;
  /** Also record every other focus operator's measure per frame (`focusValues`); default false: the chosen one only, a cheaper pass. */
  everyFocusOperator?: boolean;
  monteCarloDraws?: number;
  seed?: number;
  onProgress?: (progress: AnalysisProgress) => void;
}

/**
 * From a validated manifest and its frames to a focal length with its
 * uncertainty budget: per sweep, locate the target, measure every frame,
 * fit the focus peak and the size through focus; then solve the method's
 * model and propagate uncertainties (GUM, with a Monte Carlo cross-check).
 */
export async function analyseMeasurement(options: AnalyseMeasurementOptions): Promise<MeasurementResult> {
  const { manifest, source } = options;
  const focusOperator = options.focusOperator ?? manifest.analysis?.focusOperator ?? 'gradient-energy';
  const excludedFiles = new Set(manifest.analysis?.excludedFiles ?? []);
  const framesTotal = manifest.sweeps.reduce((n, s) => n + s.frames.length, 0);
  let framesDone = 0;
  const progress = options.onProgress ?? (() => {});
  progress({ phase: 'locating', framesDone, framesTotal });

  const sweepResults: SweepResult[] = [];
  const sweepFits: SweepFits[] = [];
  for (const [index, sweep] of manifest.sweeps.entries()) {
    const sweepLabel = `sweep ${index + 1}`;
    const frames = await analyseSweepFrames({
      frames: sweep.frames,
      source,
      pattern: manifest.target.pattern,
      polarity: manifest.target.polarity,
      focusOperator,
      everyFocusOperator: options.everyFocusOperator ?? false,
      excludedFiles,
      saturatedShareLimit: 0.01,
      concurrency: options.concurrency ?? 2,
      onFrameDone: (file) => {
        framesDone += 1;
        progress({ phase: 'measuring', framesDone, framesTotal, file });
      },
    });
    progress({ phase: 'fitting', framesDone, framesTotal });
    const peaks = fitSweep(frames.frames, { sweepLabel, peaks: sweep.moving === 'lens' ? 2 : 1 });
    sweepFits.push({ index, peaks });
    sweepResults.push(describeSweep(manifest, index, frames.frames, peaks, frames.polarity, focusOperator));
  }

  const model = buildMethodModel(manifest, sweepFits);
  const gum = propagateGum({ inputs: model.inputs.inputs, model: model.focalLength, outputUnit: 'mm' });
  const warnings = [...model.warnings];

  const draws = options.monteCarloDraws ?? manifest.analysis?.monteCarloDraws ?? 100_000;
  const mc = monteCarloCrossCheck({ inputs: model.inputs.inputs, model: model.focalLength, gum, draws, seed: options.seed ?? 20261201 });
  if (!mc.agrees) {
    warnings.push(
      `The Monte Carlo 95 % interval [${mc.intervalLow.toFixed(4)}, ${mc.intervalHigh.toFixed(4)}] mm differs from the GUM interval [${(gum.value - gum.expandedUncertainty).toFixed(4)}, ${(gum.value + gum.expandedUncertainty).toFixed(4)}] mm by more than the numerical tolerance, so the GUM framework is not validated for this measurement (JCGM 101:2008 §8); the Monte Carlo interval is the better statement.`,
    );
  }

  const extras = Object.fromEntries(
    model.extras.map((extra) => [extra.key, propagateGum({ inputs: model.inputs.inputs, model: extra.model, outputUnit: 'mm' })]),
  );
  const estimates = model.estimates.map((e) => {
    const g = propagateGum({ inputs: model.inputs.inputs, model: e.model, outputUnit: 'mm' });
    return { name: e.name, focalLengthMm: g.value, standardUncertaintyMm: g.combinedStandardUncertainty };
  });
  warnings.push(...disagreementWarnings(estimates));

  const focalLengthMm = gum.value;
  const result: MeasurementResult = {
    method: manifest.method,
    focalLengthMm,
    standardUncertaintyMm: gum.combinedStandardUncertainty,
    expandedUncertaintyMm: gum.expandedUncertainty,
    coverageFactor: gum.coverageFactor,
    coverageProbability: gum.coverageProbability,
    effectiveDegreesOfFreedom: gum.effectiveDegreesOfFreedom,
    sweeps: sweepResults,
    uncertaintyBudget: gum.budget.map((row) => ({ ...row, standardUncertaintyMm: row.contributionMm })),
    warnings,
    opticalPowerDioptres: opticalPowerDioptres(focalLengthMm),
    // P = 1000/f, so u(P) = 1000·u(f)/f² (first order).
    opticalPowerExpandedUncertaintyDioptres: (1000 * gum.expandedUncertainty) / (focalLengthMm * focalLengthMm),
    monteCarlo: {
      draws: mc.draws,
      focalLengthMm: mc.value,
      standardUncertaintyMm: mc.standardUncertainty,
      intervalLowMm: mc.intervalLow,
      intervalHighMm: mc.intervalHigh,
      endpointStandardDeviationMm: mc.endpointStandardDeviation,
      numericalToleranceMm: mc.numericalTolerance,
      agreesWithGum: mc.agrees,
    },
    estimates,
    engineVersion: ENGINE_VERSION,
  };
  if (extras.frontOffsetMm && extras.rearOffsetMm) {
    result.principalPlanes = {
      frontOffsetMm: extras.frontOffsetMm.value,
      rearOffsetMm: extras.rearOffsetMm.value,
      frontOffsetStandardUncertaintyMm: extras.frontOffsetMm.combinedStandardUncertainty,
      rearOffsetStandardUncertaintyMm: extras.rearOffsetMm.combinedStandardUncertainty,
    };
  }
  if (extras.backFocalDistanceMm) {
    result.backFocalDistanceMm = extras.backFocalDistanceMm.value;
    result.backFocalDistanceStandardUncertaintyMm = extras.backFocalDistanceMm.combinedStandardUncertainty;
  }
  if (manifest.lens) {
    const limits = toleranceLimits({
      nominalFocalLengthMm: manifest.lens.nominalFocalLengthMm,
      tolerancePercent: manifest.lens.tolerancePercent,
      toleranceMm: manifest.lens.toleranceMm,
    });
    const decision = decideConformity({
      measuredValue: focalLengthMm,
      expandedUncertainty: gum.expandedUncertainty,
      lowerLimit: limits.lowerLimit,
      upperLimit: limits.upperLimit,
      rule: manifest.lens.decisionRule,
    });
    result.conformity = {
      decision: decision.decision,
      rule: decision.rule,
      lowerLimitMm: limits.lowerLimit,
      upperLimitMm: limits.upperLimit,
      statement: decision.statement,
    };
  }
  progress({ phase: 'done', framesDone, framesTotal });
  return result;
}

function describeSweep(
  manifest: MeasurementManifest,
  index: number,
  frames: FrameAnalysis[],
  peaks: PeakEstimate[],
  polarity: SweepResult['polarity'],
  focusOperator: FocusOperator,
): SweepResult {
  const sweep = manifest.sweeps[index];
  const pitchMm = manifest.camera.pixelPitchUm / 1000;
  const magnificationOf = (p: PeakEstimate) => (p.size.sizeAtBestFocusPx * pitchMm) / manifest.target.sizeMm;
  const base: SweepResult = {
    magnification: null,
    framesUsed: frames.filter((f) => f.status === 'used').length,
    framesRejected: frames
      .filter((f) => f.status === 'rejected')
      .map((f) => ({ file: f.file, reason: f.reason ?? 'target-lost' })),
    moving: sweep.moving,
    objectPositionMm: sweep.objectPositionMm,
    lensPositionMm: sweep.lensPositionMm,
    sensorPositionMm: sweep.sensorPositionMm,
    polarity,
    focusOperator,
    focusFits: peaks.map((p) => p.focus),
    sizeFits: peaks.map((p) => p.size),
    frames,
  };
  if (peaks.length === 2) {
    return {
      ...base,
      bestFocusPositionsMm: [peaks[0].focus.bestFocusPositionMm, peaks[1].focus.bestFocusPositionMm],
      bestFocusStandardUncertaintiesMm: [peaks[0].focus.standardUncertaintyMm, peaks[1].focus.standardUncertaintyMm],
      magnifications: [magnificationOf(peaks[0]), magnificationOf(peaks[1])],
    };
  }
  const peak = peaks[0];
  const imageSizeMm = peak.size.sizeAtBestFocusPx * pitchMm;
  return {
    ...base,
    bestFocusPositionMm: peak.focus.bestFocusPositionMm,
    bestFocusStandardUncertaintyMm: peak.focus.standardUncertaintyMm,
    // With the target at infinity (collimator) there is no finite magnification.
    magnification: manifest.method === 'collimator' ? null : magnificationOf(peak),
    imageSizeMm,
    imageSizeStandardUncertaintyMm: peak.size.sizeAtBestFocusStandardUncertaintyPx * pitchMm,
  };
}

/** Two estimates of one focal length that disagree beyond their uncertainties point at a model that does not fit (e.g. a thick lens). */
function disagreementWarnings(estimates: { name: string; focalLengthMm: number; standardUncertaintyMm: number }[]): string[] {
  const warnings: string[] = [];
  const pairs = estimates.filter((e) => e.name.startsWith('from '));
  for (let i = 0; i + 1 < pairs.length; i += 2) {
    const a = pairs[i];
    const b = pairs[i + 1];
    const diff = Math.abs(a.focalLengthMm - b.focalLengthMm);
    const scale = Math.hypot(a.standardUncertaintyMm, b.standardUncertaintyMm);
    if (scale > 0 && diff > 3 * scale) {
      warnings.push(
        `The estimate ${a.name} (${a.focalLengthMm.toFixed(3)} mm) and the estimate ${b.name} (${b.focalLengthMm.toFixed(3)} mm) differ by ${(diff / scale).toFixed(1)} times their combined standard uncertainty; the lens may be thick, so consider the multi-conjugate method.`,
      );
    }
  }
  return warnings;
}
