import type { MeasurementManifest } from '../../schemas/measurement-manifest';
import { combineCorrelatedEstimates, finiteConjugateSolution, solveFiniteConjugate } from '../solvers/solve-finite-conjugate';
import { solveMultiConjugate } from '../solvers/solve-multi-conjugate';
import { multiConjugateFocalLength, multiConjugateScratch, type ConjugateColumns } from '../solvers/multi-conjugate-focal-length';
import { solveDisplacement } from '../solvers/solve-displacement';
import { solveCollimator } from '../solvers/solve-collimator';
import { solveAuxiliaryLens } from '../solvers/solve-auxiliary-lens';
import { InputSet } from './input-set';
import type { PeakEstimate } from './fit-sweep';
import { MeasurementError } from './measurement-error';

/** A measurement model: inputs with their uncertainties and the functions of them that give the results. */
export interface MethodModel {
  inputs: InputSet;
  focalLength: (values: number[]) => number;
  /** Further results with their own GUM evaluation. */
  extras: { key: 'frontOffsetMm' | 'rearOffsetMm' | 'backFocalDistanceMm'; model: (values: number[]) => number }[];
  /** Intermediate estimates reported beside the result. */
  estimates: { name: string; model: (values: number[]) => number }[];
  warnings: string[];
}

export interface SweepFits {
  /** Index of the sweep in the manifest. */
  index: number;
  peaks: PeakEstimate[];
}

/** Index of each input of one sensor-moving sweep in the value vector. */
interface SensorSweepInputs {
  objectMm?: number;
  lensMm: number;
  focusFitMm: number;
  focusRailMm: number;
  sizePx: number;
  /** Fixed: where the size line was evaluated and its slope, so size follows the fitted focus. */
  focusNominalMm: number;
  sizeSlopePxPerMm: number;
}

interface Common {
  pitchUm: number;
  targetMm: number;
}

const label = (i: number) => `sweep ${i + 1}`;

function addCommon(inputs: InputSet, manifest: MeasurementManifest): Common {
  return {
    pitchUm: inputs.add({
      name: 'pixel pitch',
      value: manifest.camera.pixelPitchUm,
      standardUncertainty: manifest.camera.pixelPitchUncertaintyUm,
      unit: 'µm',
    }),
    targetMm: inputs.add({
      name: manifest.method === 'collimator' ? 'target size (collimator focal plane)' : 'target size',
      value: manifest.target.sizeMm,
      standardUncertainty: manifest.target.sizeUncertaintyMm,
      unit: 'mm',
    }),
  };
}

function addSensorSweep(inputs: InputSet, manifest: MeasurementManifest, fit: SweepFits, withObject: boolean): SensorSweepInputs {
  const sweep = manifest.sweeps[fit.index];
  const peak = fit.peaks[0];
  const railU = manifest.scale.uncertaintyMm;
  const name = label(fit.index);
  return {
    objectMm: withObject
      ? inputs.add({ name: `object position reading, ${name}`, value: sweep.objectPositionMm as number, standardUncertainty: railU, unit: 'mm' })
      : undefined,
    lensMm: inputs.add({ name: `lens mark reading, ${name}`, value: sweep.lensPositionMm as number, standardUncertainty: railU, unit: 'mm' }),
    focusFitMm: inputs.add({
      name: `best focus (curve fit), ${name}`,
      value: peak.focus.bestFocusPositionMm,
      standardUncertainty: peak.focus.standardUncertaintyMm,
      degreesOfFreedom: peak.focus.degreesOfFreedom,
      unit: 'mm',
    }),
    focusRailMm: inputs.add({ name: `rail reading error at best focus, ${name}`, value: 0, standardUncertainty: railU, unit: 'mm' }),
    sizePx: inputs.add({
      name: `target image size at best focus (line fit), ${name}`,
      value: peak.size.sizeAtBestFocusPx,
      standardUncertainty: peak.size.sizeAtBestFocusStandardUncertaintyPx,
      degreesOfFreedom: peak.size.degreesOfFreedom,
      unit: 'px',
    }),
    focusNominalMm: peak.focus.bestFocusPositionMm,
    sizeSlopePxPerMm: peak.size.slopePxPerMm,
  };
}

/** Image size on the sensor (mm) at the fitted best focus. */
function imageSizeMm(v: number[], s: SensorSweepInputs, c: Common): number {
  const sizePx = v[s.sizePx] + s.sizeSlopePxPerMm * (v[s.focusFitMm] - s.focusNominalMm);
  return (sizePx * v[c.pitchUm]) / 1000;
}

function magnification(v: number[], s: SensorSweepInputs, c: Common): number {
  return imageSizeMm(v, s, c) / v[c.targetMm];
}

/** Image position reading at best focus, rail error included. */
function imagePositionMm(v: number[], s: SensorSweepInputs): number {
  return v[s.focusFitMm] + v[s.focusRailMm];
}

/** Writes every estimate of one quantity at the input values `v` into `out`. */
type EstimatesInto = (v: number[], out: Float64Array) => void;

/**
 * Combines correlated estimates of one quantity by generalised least squares.
 * The weights are fixed at the nominal input values, so the combined model
 * stays a plain function of the inputs for GUM and Monte Carlo. All
 * `estimateCount` estimates come from one call, so a model evaluated per
 * Monte Carlo draw solves each sweep once, and allocates nothing.
 */
function combineEstimates(inputs: InputSet, estimateCount: number, estimatesInto: EstimatesInto): (v: number[]) => number {
  const estimatesAt = (v: number[]) => {
    const out = new Float64Array(estimateCount);
    estimatesInto(v, out);
    return Array.from(out);
  };
  const x0 = inputs.values;
  const g0 = estimatesAt(x0);
  const scratch = new Float64Array(estimateCount);
  if (estimateCount === 1) {
    return (v) => {
      estimatesInto(v, scratch);
      return scratch[0];
    };
  }
  const sensitivities = inputs.inputs.map((input, j) => {
    const h = input.standardUncertainty > 0 ? input.standardUncertainty * 1e-3 : 0;
    if (h === 0) return g0.map(() => 0);
    const up = [...x0];
    const down = [...x0];
    up[j] += h;
    down[j] -= h;
    const gUp = estimatesAt(up);
    const gDown = estimatesAt(down);
    return g0.map((_, k) => (gUp[k] - gDown[k]) / (2 * h));
  });
  const jacobian = g0.map((_, k) => sensitivities.map((column) => column[k]));
  const covariance = jacobian.map((ra) =>
    jacobian.map((rb) => ra.reduce((sum, a, j) => sum + a * rb[j] * inputs.inputs[j].standardUncertainty ** 2, 0)),
  );
  const degenerate = covariance.every((row) => row.every((c) => c === 0));
  const weights = degenerate ? g0.map(() => 1 / g0.length) : combineCorrelatedEstimates({ values: g0, covariance }).weights;
  return (v) => {
    estimatesInto(v, scratch);
    let combined = 0;
    for (let k = 0; k < estimateCount; k++) combined += weights[k] * scratch[k];
    return combined;
  };
}

/** Both finite-conjugate estimates of one sweep; the options were checked at the nominal inputs, so draws skip the checks. */
function finiteConjugateEstimates(v: number[], s: SensorSweepInputs, c: Common, checked: boolean) {
  const options = {
    objectPositionMm: v[s.objectMm as number],
    lensPositionMm: v[s.lensMm],
    imagePositionMm: imagePositionMm(v, s),
    magnification: magnification(v, s, c),
    frontOffsetMm: 0,
    rearOffsetMm: 0,
  };
  return checked ? solveFiniteConjugate(options) : finiteConjugateSolution(options);
}

/** The pair (or single lens) as measured by the finite-conjugate or multi-conjugate route. */
function conjugateModel(manifest: MeasurementManifest, fits: SweepFits[], inputs: InputSet, warnings: string[]) {
  const common = addCommon(inputs, manifest);
  const sweeps = fits.map((fit) => addSensorSweep(inputs, manifest, fit, true));
  const multi = manifest.method === 'multi-conjugate' || (manifest.method === 'auxiliary-lens' && distinctObjectDistances(manifest) >= 2);

  if (!multi) {
    const estimates: MethodModel['estimates'] = [];
    sweeps.forEach((s, i) => {
      estimates.push(
        { name: `from object and image distances, ${label(fits[i].index)}`, model: (v) => finiteConjugateEstimates(v, s, common, true).fromPositionsMm },
        {
          name: `from image distance and magnification, ${label(fits[i].index)}`,
          model: (v) => finiteConjugateEstimates(v, s, common, true).fromMagnificationMm,
        },
      );
    });
    // Checked once at the nominal inputs (a bad manifest is reported there), then solved unchecked per evaluation.
    for (const s of sweeps) finiteConjugateEstimates(inputs.values, s, common, true);
    const allEstimates: EstimatesInto = (v, out) => {
      for (let i = 0; i < sweeps.length; i++) {
        const solution = finiteConjugateEstimates(v, sweeps[i], common, false);
        out[2 * i] = solution.fromPositionsMm;
        out[2 * i + 1] = solution.fromMagnificationMm;
      }
    };
    return { focal: combineEstimates(inputs, 2 * sweeps.length, allEstimates), estimates, extras: [] as MethodModel['extras'], multi };
  }

  const railU = manifest.scale.uncertaintyMm;
  const conjugatesAt = (v: number[]) =>
    sweeps.map((s) => {
      const m = magnification(v, s, common);
      const uSizePx = inputs.inputs[s.sizePx].standardUncertainty;
      const uPitch = inputs.inputs[common.pitchUm].standardUncertainty / v[common.pitchUm];
      const uTarget = inputs.inputs[common.targetMm].standardUncertainty / v[common.targetMm];
      const uRel = Math.hypot(uSizePx / Math.max(v[s.sizePx], 1e-12), uPitch, uTarget);
      return {
        objectDistanceFromMarkMm: v[s.lensMm] - v[s.objectMm as number],
        imageDistanceFromMarkMm: imagePositionMm(v, s) - v[s.lensMm],
        magnification: m,
        objectDistanceUncertaintyMm: Math.SQRT2 * railU,
        imageDistanceUncertaintyMm: Math.hypot(inputs.inputs[s.focusFitMm].standardUncertainty, Math.SQRT2 * railU),
        magnificationUncertainty: Math.abs(m) * uRel,
      };
    });
  // The least-squares weights are fixed at the nominal inputs (see combineEstimates).
  const nominal = solveMultiConjugate({ conjugates: conjugatesAt(inputs.values) });
  const weightsFixed = conjugatesAt(inputs.values).map((c) => ({
    objectDistanceUncertaintyMm: c.objectDistanceUncertaintyMm,
    imageDistanceUncertaintyMm: c.imageDistanceUncertaintyMm,
    magnificationUncertainty: c.magnificationUncertainty,
  }));
  const solveAt = (v: number[]) =>
    solveMultiConjugate({ conjugates: conjugatesAt(v).map((c, i) => ({ ...c, ...weightsFixed[i] })) });
  if (nominal.degreesOfFreedom < 1) {
    warnings.push('Two conjugates give no redundancy: the principal-plane offsets carry no check from the data.');
  }
  // The focal length alone, for the 10⁵ Monte Carlo draws: the same solve (to ~1e-10) in preallocated arrays, weights fixed as above.
  const columns: ConjugateColumns = {
    objectDistanceMm: new Float64Array(sweeps.length),
    imageDistanceMm: new Float64Array(sweeps.length),
    magnitude: new Float64Array(sweeps.length),
    objectDistanceUncertaintyMm: Float64Array.from(weightsFixed, (w) => w.objectDistanceUncertaintyMm),
    imageDistanceUncertaintyMm: Float64Array.from(weightsFixed, (w) => w.imageDistanceUncertaintyMm),
    magnificationUncertainty: Float64Array.from(weightsFixed, (w) => w.magnificationUncertainty),
  };
  const scratch = multiConjugateScratch(sweeps.length);
  const focalOnly = (v: number[]) => {
    for (let i = 0; i < sweeps.length; i++) {
      const s = sweeps[i];
      columns.objectDistanceMm[i] = v[s.lensMm] - v[s.objectMm as number];
      columns.imageDistanceMm[i] = imagePositionMm(v, s) - v[s.lensMm];
      columns.magnitude[i] = Math.abs(magnification(v, s, common));
    }
    return multiConjugateFocalLength(columns, scratch);
  };
  return {
    focal: focalOnly,
    estimates: [] as MethodModel['estimates'],
    extras: [
      { key: 'frontOffsetMm' as const, model: (v: number[]) => solveAt(v).frontOffsetMm },
      { key: 'rearOffsetMm' as const, model: (v: number[]) => solveAt(v).rearOffsetMm },
    ],
    multi,
  };
}

function distinctObjectDistances(manifest: MeasurementManifest): number {
  const distances = manifest.sweeps.map((s) => Math.round(((s.lensPositionMm ?? 0) - (s.objectPositionMm ?? 0)) * 10));
  return new Set(distances).size;
}

export function buildMethodModel(manifest: MeasurementManifest, fits: SweepFits[]): MethodModel {
  const inputs = new InputSet();
  const warnings: string[] = [];

  switch (manifest.method) {
    case 'finite-conjugate':
    case 'multi-conjugate': {
      const model = conjugateModel(manifest, fits, inputs, warnings);
      return { inputs, focalLength: model.focal, extras: model.extras, estimates: model.estimates, warnings };
    }
    case 'auxiliary-lens': {
      const pair = conjugateModel(manifest, fits, inputs, warnings);
      const aux = manifest.auxiliaryLens!;
      const auxIndex = inputs.add({
        name: 'auxiliary lens focal length',
        value: aux.focalLengthMm,
        standardUncertainty: aux.focalLengthUncertaintyMm,
        unit: 'mm',
      });
      const focal = (v: number[]) =>
        solveAuxiliaryLens({ combinedFocalLengthMm: pair.focal(v), auxiliaryFocalLengthMm: v[auxIndex] }).focalLengthMm;
      return {
        inputs,
        focalLength: focal,
        extras: [],
        estimates: [{ name: 'lens pair (in contact)', model: pair.focal }, ...pair.estimates],
        warnings,
      };
    }
    case 'collimator': {
      const common = addCommon(inputs, manifest);
      const c = manifest.collimator!;
      const fc = inputs.add({ name: 'collimator focal length', value: c.focalLengthMm, standardUncertainty: c.focalLengthUncertaintyMm, unit: 'mm' });
      const sweeps = fits.map((fit) => addSensorSweep(inputs, manifest, fit, false));
      const solveAt = (v: number[], s: SensorSweepInputs) =>
        solveCollimator({
          collimatorFocalLengthMm: v[fc],
          targetSizeMm: v[common.targetMm],
          imageSizeMm: imageSizeMm(v, s, common),
          bestFocusPositionMm: imagePositionMm(v, s),
          lensPositionMm: v[s.lensMm],
        });
      const focal = combineEstimates(inputs, sweeps.length, (v, out) => sweeps.forEach((s, i) => (out[i] = solveAt(v, s).focalLengthMm)));
      const bfd = combineEstimates(inputs, sweeps.length, (v, out) => sweeps.forEach((s, i) => (out[i] = solveAt(v, s).backFocalDistanceMm)));
      return { inputs, focalLength: focal, extras: [{ key: 'backFocalDistanceMm', model: bfd }], estimates: [], warnings };
    }
    case 'displacement': {
      const railU = manifest.scale.uncertaintyMm;
      const parts = fits.map((fit) => {
        const sweep = manifest.sweeps[fit.index];
        const name = label(fit.index);
        const objectMm = inputs.add({ name: `object position reading, ${name}`, value: sweep.objectPositionMm as number, standardUncertainty: railU, unit: 'mm' });
        const sensorMm = inputs.add({ name: `sensor position reading, ${name}`, value: sweep.sensorPositionMm as number, standardUncertainty: railU, unit: 'mm' });
        const peakInputs = fit.peaks.map((peak, k) => ({
          fit: inputs.add({
            name: `sharp lens position ${k + 1} (curve fit), ${name}`,
            value: peak.focus.bestFocusPositionMm,
            standardUncertainty: peak.focus.standardUncertaintyMm,
            degreesOfFreedom: peak.focus.degreesOfFreedom,
            unit: 'mm',
          }),
          rail: inputs.add({ name: `rail reading error at sharp position ${k + 1}, ${name}`, value: 0, standardUncertainty: railU, unit: 'mm' }),
        }));
        return (v: number[]): number =>
          solveDisplacement({
            objectPositionMm: v[objectMm],
            sensorPositionMm: v[sensorMm],
            lensPositionsMm: [v[peakInputs[0].fit] + v[peakInputs[0].rail], v[peakInputs[1].fit] + v[peakInputs[1].rail]],
          }).focalLengthMm;
      });
      warnings.push(
        'The displacement method takes the principal planes as coincident; for a thick lens the result is biased by a quarter to a half of their separation.',
      );
      const focal = combineEstimates(inputs, parts.length, (v, out) => parts.forEach((part, i) => (out[i] = part(v))));
      return { inputs, focalLength: focal, extras: [], estimates: [], warnings };
    }
    default:
      throw new MeasurementError('invalid-manifest', `invalid manifest: method ${(manifest as { method: string }).method} is not supported`);
  }
}
