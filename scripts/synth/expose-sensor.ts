import type { CoverageRegion } from './target-coverage';
import type { SeededRandom } from './seeded-random';

export interface SensorExposureOptions {
  widthPx: number;
  heightPx: number;
  bitDepth: 8 | 16;
  /** Blurred target coverage (0..1) over a region; null when no target is in view. */
  coverage: CoverageRegion | null;
  backgroundRelativeIrradiance: number;
  targetRelativeIrradiance: number;
  opticalAxisPx: { x: number; y: number };
  /** Exit pupil to sensor distance in pixels, for the natural cos⁴ fall-off; null turns it off. */
  pupilToSensorPx: number | null;
  /** Radial fall-off 1 − k·(r / r_corner)², r from the optical axis, r_corner to the farthest corner. */
  radialFalloffAtCorner: number;
  fullWellElectrons: number;
  /** Share of the full well a relative irradiance of 1 reaches on the axis at gain 1. */
  exposureLevel: number;
  exposureGain: number;
  readNoiseElectrons: number;
  noise: boolean;
  random: SeededRandom;
}

export interface SensorExposure {
  pixels: Uint8Array | Uint16Array;
  clippedPixelCount: number;
}

/**
 * Photo-electron model of the sensor: mean signal = full well × exposure ×
 * gain × relative irradiance × vignetting; Poisson shot noise (normal
 * approximation above 30 e⁻) plus Gaussian read noise; clipped at the full
 * well and quantised so that the full well maps to the top DN.
 */
export function exposeSensor(options: SensorExposureOptions): SensorExposure {
  const { widthPx, heightPx, coverage, random } = options;
  const maxDn = options.bitDepth === 16 ? 65535 : 255;
  const pixels = options.bitDepth === 16 ? new Uint16Array(widthPx * heightPx) : new Uint8Array(widthPx * heightPx);
  const dnPerElectron = maxDn / options.fullWellElectrons;
  const electronsPerIrradiance = options.fullWellElectrons * options.exposureLevel * options.exposureGain;
  const readVariance = options.readNoiseElectrons * options.readNoiseElectrons;
  const { x: ax, y: ay } = options.opticalAxisPx;
  const cornerDx = Math.max(ax, widthPx - 1 - ax);
  const cornerDy = Math.max(ay, heightPx - 1 - ay);
  const falloffPerR2 = options.radialFalloffAtCorner / (cornerDx * cornerDx + cornerDy * cornerDy);
  const inversePupilSquared = options.pupilToSensorPx === null ? 0 : 1 / (options.pupilToSensorPx * options.pupilToSensorPx);
  const background = options.backgroundRelativeIrradiance;
  const targetMinusBackground = options.targetRelativeIrradiance - background;
  const fullWell = options.fullWellElectrons;
  let clipped = 0;

  for (let y = 0; y < heightPx; y++) {
    const dy = y - ay;
    const dy2 = dy * dy;
    const row = y * widthPx;
    const coverageRow = coverage && y >= coverage.y0 && y < coverage.y0 + coverage.heightPx ? (y - coverage.y0) * coverage.widthPx : -1;
    for (let x = 0; x < widthPx; x++) {
      const dx = x - ax;
      const r2 = dx * dx + dy2;
      // Natural vignetting: cosine-fourth law, cos⁴φ with tan²φ = r²/L² (radiometry, from memory).
      const tan2 = r2 * inversePupilSquared;
      const vignetting = (1 - falloffPerR2 * r2) / ((1 + tan2) * (1 + tan2));
      let irradiance = background;
      if (coverageRow >= 0 && x >= coverage!.x0 && x < coverage!.x0 + coverage!.widthPx) {
        irradiance += targetMinusBackground * coverage!.values[coverageRow + x - coverage!.x0];
      }
      const meanElectrons = electronsPerIrradiance * irradiance * vignetting;
      let electrons = meanElectrons;
      if (options.noise) {
        electrons =
          meanElectrons > 30
            ? meanElectrons + Math.sqrt(meanElectrons + readVariance) * random.normal()
            : random.poisson(meanElectrons) + options.readNoiseElectrons * random.normal();
      }
      if (electrons >= fullWell) {
        clipped++;
        pixels[row + x] = maxDn;
      } else {
        const dn = Math.round(electrons * dnPerElectron);
        pixels[row + x] = dn < 0 ? 0 : dn > maxDn ? maxDn : dn;
      }
    }
  }
  return { pixels, clippedPixelCount: clipped };
}
