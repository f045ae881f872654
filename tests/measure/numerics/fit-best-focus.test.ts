import { describe, expect, it } from 'vitest';
import { fitBestFocus, fitTwoBestFoci, NoFocusPeakError } from '@shared/measure/focus-curve/fit-best-focus';
import { createSeededRandom } from '@shared/measure/uncertainty/seeded-random';

const gaussianCurve = (baseline: number, amplitude: number, peakMm: number, sigmaMm: number) => (z: number) =>
  baseline + amplitude * Math.exp(-((z - peakMm) ** 2) / (2 * sigmaMm ** 2));

function sweep(startMm: number, stepMm: number, count: number): number[] {
  return Array.from({ length: count }, (_, i) => startMm + i * stepMm);
}

describe('fitBestFocus', () => {
  it('finds the peak of a noise-free Gaussian curve to 1e-6 of its width, with its baseline, height and width', () => {
    const curve = gaussianCurve(0.02, 1.3, 447.37, 0.8);
    const positionsMm = sweep(443, 0.25, 37);
    const fit = fitBestFocus({ positionsMm, focusValues: positionsMm.map(curve) });
    expect(Math.abs(fit.bestFocusPositionMm - 447.37) / 0.8).toBeLessThan(1e-6);
    expect(fit.widthMm).toBeCloseTo(0.8, 6);
    expect(fit.baseline).toBeCloseTo(0.02, 6);
    expect(fit.peakValue).toBeCloseTo(1.32, 6);
    expect(fit.modelName).toBe('gaussian');
    expect(fit.outlierIndices).toEqual([]);
    expect(fit.evaluate(447.37)).toBeCloseTo(1.32, 6);
  });

  it('finds the peak of a Gaussian curve with 1 % noise to 2 % of its width', () => {
    const random = createSeededRandom(2024);
    const curve = gaussianCurve(0.1, 1, 212.4, 1.5);
    const positionsMm = sweep(205, 0.4, 38);
    const focusValues = positionsMm.map((z) => curve(z) + 0.01 * random.nextNormal());
    const fit = fitBestFocus({ positionsMm, focusValues });
    expect(Math.abs(fit.bestFocusPositionMm - 212.4) / 1.5).toBeLessThan(0.02);
    expect(fit.standardUncertaintyMm).toBeGreaterThan(0);
    expect(fit.standardUncertaintyMm).toBeLessThan(0.03);
    expect(fit.degreesOfFreedom).toBe(fit.usedIndices.length - 4);
  });

  it('states an uncertainty that matches the real scatter: over 200 seeded noise draws the z-scores have spread ≈ 1 and ~95 % lie within 2σ', () => {
    const random = createSeededRandom(77);
    const trueMm = 100.3;
    const curve = gaussianCurve(0.05, 1, trueMm, 0.6);
    const positionsMm = sweep(97.5, 0.14, 41);
    const zScores: number[] = [];
    for (let draw = 0; draw < 200; draw++) {
      const focusValues = positionsMm.map((z) => curve(z) + 0.02 * random.nextNormal());
      const fit = fitBestFocus({ positionsMm, focusValues });
      zScores.push((fit.bestFocusPositionMm - trueMm) / fit.standardUncertaintyMm);
    }
    const mean = zScores.reduce((s, x) => s + x, 0) / zScores.length;
    const spread = Math.sqrt(zScores.reduce((s, x) => s + (x - mean) ** 2, 0) / (zScores.length - 1));
    const withinTwo = zScores.filter((x) => Math.abs(x) <= 2).length / zScores.length;
    console.info(`z-scores over 200 draws: mean ${mean.toFixed(3)}, spread ${spread.toFixed(3)}, within 2σ ${(100 * withinTwo).toFixed(1)} %`);
    // spread of 200 draws from a unit distribution: ±10 % is about 2 standard errors
    expect(spread).toBeGreaterThan(0.85);
    expect(spread).toBeLessThan(1.15);
    expect(Math.abs(mean)).toBeLessThan(0.25);
    expect(withinTwo).toBeGreaterThan(0.9);
    expect(withinTwo).toBeLessThan(0.99);
  });

  it('rejects an outlying frame and then gives the same result as a fit without that frame', () => {
    const random = createSeededRandom(8);
    const curve = gaussianCurve(0.1, 1, 50, 1);
    const positionsMm = sweep(45, 0.3, 34);
    const clean = positionsMm.map((z) => curve(z) + 0.01 * random.nextNormal());
    const spoilt = clean.slice();
    const badIndex = 19; // on the flank, at 50.7 mm
    spoilt[badIndex] += 0.4;
    const fit = fitBestFocus({ positionsMm, focusValues: spoilt });
    expect(fit.outlierIndices).toEqual([badIndex]);
    expect(Number.isNaN(fit.residuals[badIndex])).toBe(true);
    expect(fit.residualsAllPoints[badIndex]).toBeGreaterThan(0.3);
    const withoutBad = fitBestFocus({
      positionsMm: positionsMm.filter((_, i) => i !== badIndex),
      focusValues: clean.filter((_, i) => i !== badIndex),
    });
    expect(fit.bestFocusPositionMm).toBeCloseTo(withoutBad.bestFocusPositionMm, 9);
    expect(fit.standardUncertaintyMm).toBeCloseTo(withoutBad.standardUncertaintyMm, 9);
    const naive = fitBestFocus({ positionsMm, focusValues: spoilt, outlierThreshold: 1e9 });
    expect(Math.abs(naive.bestFocusPositionMm - 50)).toBeGreaterThan(Math.abs(fit.bestFocusPositionMm - 50));
  });

  it('fits only a window of a few widths around the peak and marks the rest NaN', () => {
    const curve = gaussianCurve(0, 1, 30, 0.5);
    const positionsMm = sweep(20, 0.2, 101);
    const focusValues = positionsMm.map(curve);
    const fit = fitBestFocus({ positionsMm, focusValues, windowHalfWidth: 3 });
    for (const i of fit.usedIndices) expect(Math.abs(positionsMm[i] - 30)).toBeLessThanOrEqual(1.5 + 1e-9);
    expect(fit.usedIndices.length).toBe(15);
    expect(fit.residuals.filter(Number.isNaN).length).toBe(101 - 15);
  });

  it('accepts frames in any order and reports indices into the input', () => {
    const curve = gaussianCurve(0.2, 2, 12, 1);
    const positionsMm = [14, 9, 12.5, 10, 11, 13, 15, 8, 12, 11.5, 13.5, 10.5, 9.5, 14.5];
    const fit = fitBestFocus({ positionsMm, focusValues: positionsMm.map(curve) });
    expect(fit.bestFocusPositionMm).toBeCloseTo(12, 8);
    expect(fit.residuals[0]).toBeCloseTo(0, 8);
  });

  it('recovers a Lorentzian peak with the Lorentzian model, its width being the half-width at half maximum', () => {
    const lorentz = (z: number) => 0.3 + 2 / (1 + ((z - 71.2) / 0.9) ** 2);
    const positionsMm = sweep(66, 0.25, 41);
    const fit = fitBestFocus({ positionsMm, focusValues: positionsMm.map(lorentz), model: 'lorentzian', windowHalfWidth: 6 });
    expect(fit.bestFocusPositionMm).toBeCloseTo(71.2, 7);
    expect(fit.widthMm).toBeCloseTo(0.9, 6);
    expect(fit.modelName).toBe('lorentzian');
  });

  it('throws NoFocusPeakError for a monotonic curve', () => {
    const positionsMm = sweep(0, 1, 20);
    const rising = positionsMm.map((z) => 1 + 0.1 * z);
    expect(() => fitBestFocus({ positionsMm, focusValues: rising })).toThrow(NoFocusPeakError);
    expect(() => fitBestFocus({ positionsMm, focusValues: rising })).toThrow(
      'no focus peak inside the sweep: the focus measure is highest at the end of the sweep (19 mm), so best focus lies outside it or the curve is monotonic',
    );
    try {
      fitBestFocus({ positionsMm, focusValues: rising.reverse() });
    } catch (error) {
      expect((error as Error).name).toBe('NoFocusPeakError');
    }
  });

  it('throws NoFocusPeakError when the peak lies just past the end of the sweep, even if the last frame is low', () => {
    const curve = gaussianCurve(0, 1, 10.3, 1);
    const positionsMm = sweep(0, 0.5, 21); // 0 … 10 mm
    const focusValues = positionsMm.map(curve);
    expect(() => fitBestFocus({ positionsMm, focusValues })).toThrow(/highest at the end of the sweep \(10 mm\)/);
    focusValues[20] -= 0.3; // a spoilt last frame hides the rising edge from the maximum search
    expect(() => fitBestFocus({ positionsMm, focusValues })).toThrow(NoFocusPeakError);
    expect(() => fitBestFocus({ positionsMm, focusValues })).toThrow(/at least 2 on each side are needed$/);
  });

  it('throws NoFocusPeakError with fewer than 5 frames', () => {
    expect(() => fitBestFocus({ positionsMm: [1, 2, 3, 4], focusValues: [1, 2, 3, 1] })).toThrow(
      'no focus peak inside the sweep: only 4 frames, at least 5 are needed to fit a peak',
    );
  });

  it('names the bad option', () => {
    expect(() => fitBestFocus({ positionsMm: [1, 2], focusValues: [1] })).toThrow(
      'Options positionsMm and focusValues must have the same length (2 positions, 1 focus values).',
    );
    expect(() => fitBestFocus({ positionsMm: [1, 2, 3, 4, 5], focusValues: [1, 2, NaN, 2, 1] })).toThrow(
      'Option focusValues value 3 is not a finite number.',
    );
  });
});

describe('fitTwoBestFoci', () => {
  it('finds both sharp lens positions of a displacement sweep, ordered by position', () => {
    const random = createSeededRandom(31);
    const first = gaussianCurve(0, 1, 160.4, 0.7);
    const second = gaussianCurve(0, 0.45, 239.1, 1.6);
    const positionsMm = sweep(150, 0.5, 201);
    const focusValues = positionsMm.map((z) => 0.05 + first(z) + second(z) + 0.01 * random.nextNormal());
    // hand the frames over in reverse to check the ordering
    const [a, b] = fitTwoBestFoci({ positionsMm: positionsMm.slice().reverse(), focusValues: focusValues.slice().reverse() });
    expect(Math.abs(a.bestFocusPositionMm - 160.4)).toBeLessThan(3 * a.standardUncertaintyMm + 0.01);
    expect(Math.abs(b.bestFocusPositionMm - 239.1)).toBeLessThan(3 * b.standardUncertaintyMm + 0.01);
    expect(a.widthMm).toBeCloseTo(0.7, 1);
    expect(b.widthMm).toBeCloseTo(1.6, 1);
    expect(a.residuals.length).toBe(201);
  });

  it('throws NoFocusPeakError when the sweep shows only one peak', () => {
    const random = createSeededRandom(32);
    const curve = gaussianCurve(0.05, 1, 180, 1);
    const positionsMm = sweep(150, 0.5, 121);
    const focusValues = positionsMm.map((z) => curve(z) + 0.01 * random.nextNormal());
    expect(() => fitTwoBestFoci({ positionsMm, focusValues })).toThrow(
      'no focus peak inside the sweep: found only one clear peak, and a lens-displacement sweep needs two (the lens is sharp at two positions)',
    );
  });
});
