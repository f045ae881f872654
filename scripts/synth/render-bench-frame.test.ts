import { describe, expect, it } from 'vitest';
import type { BenchScenario } from './bench-scenario';
import { checkBenchScenarioOptions } from './check-bench-scenario-options';
import { solveSweepFocus } from './paraxial-bench';
import { renderBenchFrame } from './render-bench-frame';
import { createSeededRandom } from './seeded-random';
import { featureMoments, gradientEnergy, toGrey, traceImage, windowAround, type GreyPixels } from './test-support';

const PITCH_MM = 3.45e-3;

/** A noise-free, flicker-free, unvignetted 16-bit bench: what is left is geometry and blur. */
function quietScenario(overrides: Partial<BenchScenario> = {}): BenchScenario {
  return {
    method: 'finite-conjugate',
    seed: 11,
    lens: { focalLengthMm: 100, frontOffsetMm: 2.5, rearOffsetMm: -1.5, fNumber: 8 },
    camera: {
      pixelPitchUm: 3.45,
      widthPx: 800,
      heightPx: 600,
      format: 'png16',
      noise: false,
      exposureFlickerFraction: 0,
      vignetting: { naturalCos4: false, radialFalloffAtCorner: 0 },
      psfFloorSigmaPx: 0.3,
      opticalAxisOffsetPx: { x: 13, y: -9 },
    },
    target: { pattern: 'dot-pair', sizeMm: 3, dotDiameterMm: 0.8, rotationDeg: 7, centreOffsetMm: { x: 0.2, y: -0.15 } },
    sweeps: [{ objectPositionMm: 0, lensPositionMm: 300 }],
    ...overrides,
  };
}

function render(scenario: BenchScenario, positionMm: number, options: { targetVisible?: boolean; exposureGain?: number } = {}) {
  const resolved = checkBenchScenarioOptions(scenario);
  const frame = renderBenchFrame({
    scenario: resolved,
    sweepIndex: 0,
    positionMm,
    exposureGain: options.exposureGain ?? 1,
    targetVisible: options.targetVisible,
    random: createSeededRandom(resolved.seed, 0, 0, 3),
  });
  return { frame, image: toGrey(frame.pixels, frame.widthPx, frame.heightPx) };
}

/** Where the test expects the two dot centres: axis − scale·(u, v)/pitch (image inverted, rotated 180°). */
function expectedDotCentresPx(scenario: BenchScenario, scale: number): Array<[number, number]> {
  const axisX = (scenario.camera.widthPx - 1) / 2 + scenario.camera.opticalAxisOffsetPx!.x;
  const axisY = (scenario.camera.heightPx - 1) / 2 + scenario.camera.opticalAxisOffsetPx!.y;
  const angle = ((scenario.target.rotationDeg ?? 0) * Math.PI) / 180;
  const centre = scenario.target.centreOffsetMm ?? { x: 0, y: 0 };
  return [-1, 1].map((side) => {
    const u = centre.x + (side * scenario.target.sizeMm * Math.cos(angle)) / 2;
    const v = centre.y + (side * scenario.target.sizeMm * Math.sin(angle)) / 2;
    return [axisX - (scale * u) / PITCH_MM, axisY - (scale * v) / PITCH_MM];
  });
}

function dotCentroids(image: GreyPixels, expected: Array<[number, number]>, halfWindowPx: number, sign: 1 | -1 = -1) {
  return expected.map(([x, y]) => featureMoments(image, windowAround(x, y, halfWindowPx), sign));
}

const distance = (a: { x: number; y: number }, b: { x: number; y: number }) => Math.hypot(a.x - b.x, a.y - b.y);

describe('renderBenchFrame geometry', () => {
  it('renders the dot pair at best focus |m|·y/pitch apart (ray-transfer-matrix trace) to 0.1 %, inverted about the axis to 0.1 px', () => {
    const scenario = quietScenario();
    // Thick lens: principal planes at mark + h and mark + h′ (methods.md §1), traced with ABCD matrices.
    const traced = traceImage({ objectMm: 0, frontPlaneMm: 302.5, rearPlaneMm: 298.5, focalLengthMm: 100 });
    expect(traced.signedMagnification).toBeLessThan(0);
    const m = -traced.signedMagnification;
    const { image } = render(scenario, traced.imagePlaneMm);
    const expected = expectedDotCentresPx(scenario, m);
    const [left, right] = dotCentroids(image, expected, 90);
    const separationPx = distance(left, right);
    const expectedPx = (m * scenario.target.sizeMm) / PITCH_MM;
    expect(Math.abs(separationPx / expectedPx - 1)).toBeLessThan(1e-3);
    expect(Math.hypot(left.x - expected[0][0], left.y - expected[0][1])).toBeLessThan(0.1);
    expect(Math.hypot(right.x - expected[1][0], right.y - expected[1][1])).toBeLessThan(0.1);
  });

  it('changes the apparent dot separation linearly through focus with the slope the exit-pupil position predicts (similar triangles)', () => {
    const pupilOffsetMm = 30;
    const scenario = quietScenario({ lens: { focalLengthMm: 100, frontOffsetMm: 0, rearOffsetMm: 0, fNumber: 8, exitPupilOffsetMm: pupilOffsetMm } });
    const traced = traceImage({ objectMm: 0, frontPlaneMm: 300, rearPlaneMm: 300, focalLengthMm: 100 });
    const m = -traced.signedMagnification;
    const pupilMm = 300 + pupilOffsetMm;
    const separations = [-1.5, 0, 1.5].map((defocusMm) => {
      const z = traced.imagePlaneMm + defocusMm;
      const { image } = render(scenario, z);
      // Chief rays through the exit pupil centre: scale ∝ (z − z_p) (methods.md §1).
      const [a, b] = dotCentroids(image, expectedDotCentresPx(scenario, (m * (z - pupilMm)) / (traced.imagePlaneMm - pupilMm)), 110);
      return distance(a, b);
    });
    const slopePxPerMm = (separations[2] - separations[0]) / 3;
    const expectedSlope = (m * scenario.target.sizeMm) / (traced.imagePlaneMm - pupilMm) / PITCH_MM;
    const slopeIfPupilAtRearPlane = (m * scenario.target.sizeMm) / (traced.imagePlaneMm - 300) / PITCH_MM;
    expect(Math.abs(slopePxPerMm / expectedSlope - 1)).toBeLessThan(0.005);
    expect(Math.abs(slopePxPerMm / slopeIfPupilAtRearPlane - 1)).toBeGreaterThan(0.1);
    // Linear: the middle point lies on the chord.
    expect(Math.abs((separations[0] + separations[2]) / 2 - separations[1])).toBeLessThan(0.02);
  });

  it('grows the blur of a point-like dot as a uniform disc of radius c/2 = D_p·|z − z_img| / (2(z_img − z_p)) to 1 %', () => {
    const scenario = quietScenario({
      lens: { focalLengthMm: 100, frontOffsetMm: 0, rearOffsetMm: 0, fNumber: 8 },
      target: { pattern: 'dot-pair', sizeMm: 3, dotDiameterMm: 0.04, rotationDeg: 0 },
    });
    const traced = traceImage({ objectMm: 0, frontPlaneMm: 300, rearPlaneMm: 300, focalLengthMm: 100 });
    const m = -traced.signedMagnification;
    const pupilDiameterMm = 100 / 8;
    const moment = (defocusMm: number) => {
      const z = traced.imagePlaneMm + defocusMm;
      const { image } = render(scenario, z);
      const scale = (m * (z - 300)) / (traced.imagePlaneMm - 300);
      const [dot] = dotCentroids(image, expectedDotCentresPx(scenario, scale), 60);
      return dot.radialSecondMoment;
    };
    const inFocus = moment(0);
    for (const defocusMm of [-1.5, 0.8, 2]) {
      // Second moments add under convolution; a uniform disc of radius R has ⟨r²⟩ = R²/2 (from memory).
      const radiusPx = Math.sqrt(2 * (moment(defocusMm) - inFocus));
      const expectedRadiusPx = (pupilDiameterMm * Math.abs(defocusMm)) / (traced.imagePlaneMm - 300) / 2 / PITCH_MM;
      expect(Math.abs(radiusPx / expectedRadiusPx - 1)).toBeLessThan(0.01);
    }
  });

  it('keeps the dark area of a tilted square equal to (|m|·side)² through focus (blur conserves the deficit) to 0.2 %', () => {
    const scenario = quietScenario({ target: { pattern: 'square', sizeMm: 2, rotationDeg: 4 } });
    const traced = traceImage({ objectMm: 0, frontPlaneMm: 302.5, rearPlaneMm: 298.5, focalLengthMm: 100 });
    const m = -traced.signedMagnification;
    const bright = Math.round(0.65 * 65535);
    const dark = 0.06 * 0.65 * 65535;
    for (const defocusMm of [0, 2]) {
      const z = traced.imagePlaneMm + defocusMm;
      const scale = (m * (z - 298.5)) / (traced.imagePlaneMm - 298.5);
      const { image } = render(scenario, z);
      const [centre] = expectedDotCentresPx({ ...scenario, target: { ...scenario.target, sizeMm: 0 } }, scale);
      const { total } = featureMoments(image, windowAround(centre[0], centre[1], 230), -1);
      const sidePx = Math.sqrt(total / (bright - dark));
      expect(Math.abs(sidePx / ((scale * 2) / PITCH_MM) - 1)).toBeLessThan(0.002);
    }
  });

  it('images a collimated target at the rear focal plane with size f·tan(atan(y/f_c)) to 0.1 %', () => {
    const scenario = quietScenario({
      method: 'collimator',
      lens: { focalLengthMm: 100, frontOffsetMm: 2.5, rearOffsetMm: -1.5, fNumber: 8 },
      collimator: { focalLengthMm: 400 },
      target: { pattern: 'dot-pair', sizeMm: 6, dotDiameterMm: 1.5, rotationDeg: 0 },
      sweeps: [{ lensPositionMm: 500 }],
    });
    // Parallel bundle at θ = atan(y/f_c) focuses in the rear focal plane H′ + f at height f·tanθ (paraxial optics, from memory).
    const rearFocalPlaneMm = 500 - 1.5 + 100;
    const imageSizeMm = 100 * Math.tan(Math.atan(6 / 400));
    const { image, frame } = render(scenario, rearFocalPlaneMm);
    expect(frame.geometry.blurDiameterPx).toBe(0);
    const [a, b] = dotCentroids(image, expectedDotCentresPx(scenario, 100 / 400), 80);
    expect(Math.abs(distance(a, b) / (imageSizeMm / PITCH_MM) - 1)).toBeLessThan(1e-3);
  });
});

describe('displacement bench (Bessel)', () => {
  const objectMm = 0;
  const sensorMm = 450;
  const f = 99.6;
  const scenario = quietScenario({
    method: 'displacement',
    lens: { focalLengthMm: f, frontOffsetMm: 0, rearOffsetMm: 0, fNumber: 8 },
    camera: { ...quietScenario().camera, widthPx: 1200, heightPx: 700 },
    target: { pattern: 'dot-pair', sizeMm: 1.2, dotDiameterMm: 0.3, rotationDeg: 0 },
    sweeps: [{ objectPositionMm: objectMm, sensorPositionMm: sensorMm }],
  });
  // Two conjugate lens positions d apart with a + b = D; f = (D² − d²)/(4D) (methods.md §6, Bessel's method).
  const D = sensorMm - objectMm;
  const d = Math.sqrt(D * D - 4 * D * f);
  const sharpLensMm = [objectMm + (D - d) / 2, objectMm + (D + d) / 2];

  it('puts the two sharp lens positions where Bessel\'s relation says, and they give back f', () => {
    const resolved = checkBenchScenarioOptions(scenario);
    const focus = solveSweepFocus({ scenario: resolved, sweepIndex: 0 });
    expect(focus.map((x) => x.positionMm)[0]).toBeCloseTo(sharpLensMm[0], 9);
    expect(focus.map((x) => x.positionMm)[1]).toBeCloseTo(sharpLensMm[1], 9);
    const dFromTruth = focus[1].positionMm - focus[0].positionMm;
    expect((D * D - dFromTruth * dFromTruth) / (4 * D)).toBeCloseTo(f, 9);
  });

  it('renders sharpest at the two lens positions, with magnifications m and 1/m: separation ratio ((D + d)/(D − d))² to 0.2 %', () => {
    const separations = sharpLensMm.map((lensMm) => {
      const m = (D - (lensMm - objectMm)) / (lensMm - objectMm);
      const window = (x: number, y: number) => windowAround(x, y, 20 + (m * 0.3) / PITCH_MM);
      const sharpness = (offsetMm: number) => {
        const { image } = render(scenario, lensMm + offsetMm);
        const [p] = expectedDotCentresPx(scenario, m);
        return { image, energy: gradientEnergy(image, window(p[0], p[1])) };
      };
      const sharp = sharpness(0);
      expect(sharp.energy).toBeGreaterThan(sharpness(-0.3).energy);
      expect(sharp.energy).toBeGreaterThan(sharpness(0.3).energy);
      const [a, b] = expectedDotCentresPx(scenario, m).map(([x, y]) => featureMoments(sharp.image, window(x, y), -1));
      return distance(a, b);
    });
    expect(Math.abs(separations[0] / separations[1] / ((D + d) / (D - d)) ** 2 - 1)).toBeLessThan(0.002);
  });
});

describe('sensor model', () => {
  it('falls off toward the corner as (1 − k·ρ²)·cos⁴φ with tanφ = r / (sensor − exit pupil)', () => {
    const base = quietScenario();
    const k = 0.12;
    const scenario = quietScenario({ camera: { ...base.camera, vignetting: { naturalCos4: true, radialFalloffAtCorner: k } } });
    const traced = traceImage({ objectMm: 0, frontPlaneMm: 302.5, rearPlaneMm: 298.5, focalLengthMm: 100 });
    const { image } = render(scenario, traced.imagePlaneMm, { targetVisible: false });
    const axisX = 399.5 + 13, axisY = 299.5 - 9;
    const at = (x: number, y: number) => image.values[y * 800 + x];
    // Farthest corner from the axis is (0, 599); pixel (413, 291) is half a pixel from the axis in each direction.
    const rPx = Math.hypot(0 - axisX, 599 - axisY);
    const tanPhi = (rPx * PITCH_MM) / (traced.imagePlaneMm - 298.5);
    // Cosine-fourth law of natural vignetting (radiometry, from memory).
    const expectedRatio = (1 - k) * Math.cos(Math.atan(tanPhi)) ** 4;
    expect(Math.abs(at(0, 599) / at(413, 291) - expectedRatio)).toBeLessThan(2e-4);
  });

  it('adds shot noise with variance equal to the mean photo-electron count, plus read noise', () => {
    const base = quietScenario();
    const scenario = quietScenario({ camera: { ...base.camera, noise: true, readNoiseElectrons: 5, fullWellElectrons: 20_000 } });
    const { image } = render(scenario, 450, { targetVisible: false });
    let sum = 0, sum2 = 0, n = 0;
    for (let y = 0; y < 200; y++) {
      for (let x = 0; x < 200; x++) {
        const v = image.values[y * 800 + x];
        sum += v;
        sum2 += v * v;
        n++;
      }
    }
    const dnPerElectron = 65535 / 20_000;
    const meanElectrons = sum / n / dnPerElectron;
    const varianceElectrons = (sum2 / n - (sum / n) ** 2) / dnPerElectron ** 2;
    expect(meanElectrons).toBeGreaterThan(0.64 * 20_000);
    // Poisson statistics: variance = mean (from memory); read noise adds σ_r². 40 000 samples: ±1.5 % standard error.
    expect(Math.abs(varianceElectrons / (meanElectrons + 25) - 1)).toBeLessThan(0.05);
  });

  it('makes light-on-dark targets brighter than their background', () => {
    const scenario = quietScenario({ target: { ...quietScenario().target, polarity: 'light-on-dark' } });
    const traced = traceImage({ objectMm: 0, frontPlaneMm: 302.5, rearPlaneMm: 298.5, focalLengthMm: 100 });
    const { image } = render(scenario, traced.imagePlaneMm);
    const [p] = expectedDotCentresPx(scenario, -traced.signedMagnification);
    const dot = featureMoments(image, windowAround(p[0], p[1], 90), 1);
    expect(dot.total).toBeGreaterThan(0);
    expect(image.values[Math.round(p[1]) * 800 + Math.round(p[0])]).toBeGreaterThan(0.9 * 0.65 * 65535);
  });
});
