import type { PixelRect } from '../../shared/measure/types';
import { blurWithDefocusPsf, defocusPsfRadiusPx } from './blur-with-defocus-psf';
import type { ResolvedBenchScenario } from './check-bench-scenario-options';
import { exposeSensor } from './expose-sensor';
import { sensorOptics, type SensorOptics } from './paraxial-bench';
import type { SeededRandom } from './seeded-random';
import { rasteriseFeatureCoverage, type CoverageRegion, type SensorFeature } from './target-coverage';

export interface BenchFrameGeometry {
  optics: SensorOptics;
  opticalAxisPx: { x: number; y: number };
  blurDiameterPx: number;
  /** Target size on the sensor (dot-pair centre distance, square side), mm. */
  imageSizeOnSensorMm: number;
  /** The sharp geometric image, inverted (rotated 180° about the optical axis). */
  features: SensorFeature[];
  /** Pixels the blurred target can reach (sharp bounds widened by the PSF reach). */
  blurredTargetBoundsPx: PixelRect;
}

/** Where the optical axis meets the sensor: pixel centres at integers, offset from the frame centre. */
export function opticalAxisPx(scenario: ResolvedBenchScenario): { x: number; y: number } {
  return {
    x: (scenario.camera.widthPx - 1) / 2 + scenario.camera.opticalAxisOffsetPx.x,
    y: (scenario.camera.heightPx - 1) / 2 + scenario.camera.opticalAxisOffsetPx.y,
  };
}

/** Rail readings of lens mark and sensor for a frame of a sweep (the moving part reads positionMm). */
export function benchReadings(options: { scenario: ResolvedBenchScenario; sweepIndex: number; positionMm: number }): { lensMarkMm: number; sensorMm: number } {
  const { scenario, sweepIndex, positionMm } = options;
  const sweep = scenario.sweeps[sweepIndex];
  return scenario.method === 'displacement'
    ? { lensMarkMm: positionMm, sensorMm: sweep.sensorPositionMm! }
    : { lensMarkMm: sweep.lensPositionMm!, sensorMm: positionMm };
}

/** Target points in its own plane, mm from the optical axis. */
function targetOutline(scenario: ResolvedBenchScenario): { discs: Array<{ u: number; v: number; radiusMm: number }>; polygon: Array<[number, number]> | null } {
  const { pattern, sizeMm, dotDiameterMm, rotationDeg, centreOffsetMm } = scenario.target;
  const angle = (rotationDeg * Math.PI) / 180;
  const cos = Math.cos(angle), sin = Math.sin(angle);
  const place = (p: number, q: number): [number, number] => [centreOffsetMm.x + p * cos - q * sin, centreOffsetMm.y + p * sin + q * cos];
  if (pattern === 'dot-pair') {
    return {
      discs: [-sizeMm / 2, sizeMm / 2].map((p) => {
        const [u, v] = place(p, 0);
        return { u, v, radiusMm: dotDiameterMm / 2 };
      }),
      polygon: null,
    };
  }
  const h = sizeMm / 2;
  return { discs: [], polygon: [place(-h, -h), place(h, -h), place(h, h), place(-h, h)] };
}

/** Optics and the sharp inverted target outline on the sensor for one frame; the moving part reads positionMm. */
export function benchFrameGeometry(options: { scenario: ResolvedBenchScenario; sweepIndex: number; positionMm: number }): BenchFrameGeometry {
  const { scenario, sweepIndex, positionMm } = options;
  const sweep = scenario.sweeps[sweepIndex];
  const { lensMarkMm, sensorMm } = benchReadings({ scenario, sweepIndex, positionMm });
  const optics = sensorOptics({ scenario, lensMarkMm, objectPositionMm: sweep.objectPositionMm, sensorMm });
  const pitchMm = scenario.camera.pixelPitchUm / 1000;
  const axis = opticalAxisPx(scenario);
  const scale = optics.sensorScale;
  // Inverted image: a target point (u, v) lands at −scale·(u, v) from the axis.
  const toSensor = (u: number, v: number): [number, number] => [axis.x - (scale * u) / pitchMm, axis.y - (scale * v) / pitchMm];
  const outline = targetOutline(scenario);
  const features: SensorFeature[] = outline.polygon
    ? [{ kind: 'polygon', verticesPx: outline.polygon.map(([u, v]) => toSensor(u, v)) }]
    : outline.discs.map(({ u, v, radiusMm }) => {
        const [x, y] = toSensor(u, v);
        return { kind: 'disc', centreXPx: x, centreYPx: y, radiusPx: (scale * radiusMm) / pitchMm };
      });
  const blurDiameterPx = optics.blurDiameterMm / pitchMm;
  const reach = defocusPsfRadiusPx(blurDiameterPx, scenario.camera.psfFloorSigmaPx);
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const f of features) {
    const points: Array<[number, number]> =
      f.kind === 'disc'
        ? [[f.centreXPx - f.radiusPx, f.centreYPx - f.radiusPx], [f.centreXPx + f.radiusPx, f.centreYPx + f.radiusPx]]
        : f.verticesPx;
    for (const [x, y] of points) {
      minX = Math.min(minX, x); maxX = Math.max(maxX, x);
      minY = Math.min(minY, y); maxY = Math.max(maxY, y);
    }
  }
  const x0 = Math.floor(minX) - reach;
  const y0 = Math.floor(minY) - reach;
  return {
    optics,
    opticalAxisPx: axis,
    blurDiameterPx,
    imageSizeOnSensorMm: scale * scenario.target.sizeMm,
    features,
    blurredTargetBoundsPx: { x: x0, y: y0, width: Math.ceil(maxX) + reach + 1 - x0, height: Math.ceil(maxY) + reach + 1 - y0 },
  };
}

export interface BenchFrameRequest {
  scenario: ResolvedBenchScenario;
  sweepIndex: number;
  positionMm: number;
  exposureGain: number;
  /** false renders the background only (target occluded). Default true. */
  targetVisible?: boolean;
  random: SeededRandom;
}

export interface RenderedBenchFrame {
  widthPx: number;
  heightPx: number;
  bitDepth: 8 | 16;
  pixels: Uint8Array | Uint16Array;
  clippedPixelCount: number;
  geometry: BenchFrameGeometry;
}

/** Blurs each feature on its own padded region (convolution is linear) and sums them into one region. */
function blurredTargetCoverage(geometry: BenchFrameGeometry, floorSigmaPx: number): CoverageRegion {
  const reach = defocusPsfRadiusPx(geometry.blurDiameterPx, floorSigmaPx);
  const parts = geometry.features.map((feature) => {
    const region = rasteriseFeatureCoverage(feature, reach);
    region.values = blurWithDefocusPsf({
      values: region.values,
      widthPx: region.widthPx,
      heightPx: region.heightPx,
      blurDiameterPx: geometry.blurDiameterPx,
      floorSigmaPx,
    });
    return region;
  });
  const x0 = Math.min(...parts.map((p) => p.x0));
  const y0 = Math.min(...parts.map((p) => p.y0));
  const widthPx = Math.max(...parts.map((p) => p.x0 + p.widthPx)) - x0;
  const heightPx = Math.max(...parts.map((p) => p.y0 + p.heightPx)) - y0;
  const values = new Float64Array(widthPx * heightPx);
  for (const p of parts) {
    for (let j = 0; j < p.heightPx; j++) {
      const target = (p.y0 - y0 + j) * widthPx + (p.x0 - x0);
      for (let i = 0; i < p.widthPx; i++) values[target + i] += p.values[j * p.widthPx + i];
    }
  }
  return { x0, y0, widthPx, heightPx, values };
}

/** Renders one frame of a sweep: sharp inverted target, defocus PSF, vignetting, exposure and noise. */
export function renderBenchFrame(request: BenchFrameRequest): RenderedBenchFrame {
  const { scenario } = request;
  const geometry = benchFrameGeometry({ scenario, sweepIndex: request.sweepIndex, positionMm: request.positionMm });
  const coverage = request.targetVisible === false ? null : blurredTargetCoverage(geometry, scenario.camera.psfFloorSigmaPx);
  const dark = scenario.target.darkRelativeIrradiance;
  const lightOnDark = scenario.target.polarity === 'light-on-dark';
  const pitchMm = scenario.camera.pixelPitchUm / 1000;
  const exposure = exposeSensor({
    widthPx: scenario.camera.widthPx,
    heightPx: scenario.camera.heightPx,
    bitDepth: scenario.camera.bitDepth,
    coverage,
    backgroundRelativeIrradiance: lightOnDark ? dark : 1,
    targetRelativeIrradiance: lightOnDark ? 1 : dark,
    opticalAxisPx: geometry.opticalAxisPx,
    pupilToSensorPx: scenario.camera.naturalCos4 ? geometry.optics.pupilToSensorMm / pitchMm : null,
    radialFalloffAtCorner: scenario.camera.radialFalloffAtCorner,
    fullWellElectrons: scenario.camera.fullWellElectrons,
    exposureLevel: scenario.camera.exposureLevel,
    exposureGain: request.exposureGain,
    readNoiseElectrons: scenario.camera.readNoiseElectrons,
    noise: scenario.camera.noise,
    random: request.random,
  });
  return {
    widthPx: scenario.camera.widthPx,
    heightPx: scenario.camera.heightPx,
    bitDepth: scenario.camera.bitDepth,
    pixels: exposure.pixels,
    clippedPixelCount: exposure.clippedPixelCount,
    geometry,
  };
}
